import { act, type ReactNode } from "react";
import { createRoot, type Root } from "react-dom/client";
import { afterEach, beforeEach } from "vitest";

(globalThis as { IS_REACT_ACT_ENVIRONMENT?: boolean }).IS_REACT_ACT_ENVIRONMENT = true;

/**
 * A fresh React root in a <div> on the page for each test of a jsdom file, unmounted and removed
 * after it. Call at the top of the file; `host` and `render` are there inside tests.
 */
export function mountEachTest() {
  let host: HTMLDivElement | undefined;
  let root: Root | undefined;
  beforeEach(() => {
    host = document.createElement("div");
    document.body.append(host);
    root = createRoot(host);
  });
  afterEach(() => {
    act(() => root?.unmount());
    host?.remove();
  });
  return {
    get host(): HTMLDivElement {
      if (!host) throw new Error("mountEachTest: the host exists inside tests only.");
      return host;
    },
    render(node: ReactNode) {
      act(() => root?.render(node));
    },
  };
}
