import { StandaloneFrame } from "@/components/shell/standalone-frame";
import { NotFoundNotice } from "@/components/ui/not-found-notice";

export default function NotFound() {
  return (
    <StandaloneFrame>
      <NotFoundNotice />
    </StandaloneFrame>
  );
}
