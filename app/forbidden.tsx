import { StandaloneFrame } from "@/components/shell/standalone-frame";
import { Refused } from "@/components/ui/refused";

/** forbidden() outside the signed-in pages: ours, not Next.js's default (which every page's payload also carried). */
export default function Forbidden() {
  return (
    <StandaloneFrame>
      <Refused />
    </StandaloneFrame>
  );
}
