import { NotFoundNotice } from "@/components/ui/not-found-notice";

export default function NotFound() {
  return <NotFoundNotice />;
}
