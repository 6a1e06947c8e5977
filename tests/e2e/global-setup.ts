import { prepareBuildAndData } from "@/tests/e2e/harness";

/**
 * Before any browser test file: the app's build and the seeded data template, made side by side
 * once for the run (each is the longest wait of the first file otherwise). With several test
 * workers, none of them starts until both are there.
 */
export default async function setup(): Promise<void> {
  await prepareBuildAndData();
}
