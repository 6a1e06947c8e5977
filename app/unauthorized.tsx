import { StandaloneFrame } from "@/components/shell/standalone-frame";
import { SignInFirst } from "@/components/ui/sign-in-first";

/** unauthorized(): ours, not Next.js's default (which every page's payload also carried). */
export default function Unauthorized() {
  return (
    <StandaloneFrame>
      <SignInFirst />
    </StandaloneFrame>
  );
}
