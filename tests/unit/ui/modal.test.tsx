// @vitest-environment jsdom
import { act } from "react";
import { createRoot, type Root } from "react-dom/client";
import { afterEach, beforeEach, expect, test, vi } from "vitest";

import { ConfirmDialog } from "@/components/ui/confirm-dialog";
import { Modal } from "@/components/ui/modal";

/* Issue 13: a dialog opened from inside a form must never submit that form. Every dialog in the
   app goes through Modal, which renders into <body> and keeps its form's submit to itself. */

(globalThis as { IS_REACT_ACT_ENVIRONMENT?: boolean }).IS_REACT_ACT_ENVIRONMENT = true;

let root: Root;
let host: HTMLDivElement;

beforeEach(() => {
  // jsdom's <dialog> may lack the modal methods; these keep the open attribute in step.
  HTMLDialogElement.prototype.showModal ??= function (this: HTMLDialogElement) {
    this.setAttribute("open", "");
  };
  HTMLDialogElement.prototype.close ??= function (this: HTMLDialogElement) {
    this.removeAttribute("open");
  };
  host = document.createElement("div");
  document.body.append(host);
  root = createRoot(host);
});
afterEach(() => {
  act(() => root.unmount());
  host.remove();
});

function submitInner(form: HTMLFormElement) {
  act(() => {
    form.dispatchEvent(new Event("submit", { bubbles: true, cancelable: true }));
  });
}

test("a form in a Modal opened inside a page form is outside it in the DOM and its submit stays inside", () => {
  const outer = vi.fn((e: React.FormEvent) => e.preventDefault());
  const inner = vi.fn((e: React.FormEvent) => e.preventDefault());
  act(() =>
    root.render(
      <form onSubmit={outer} data-testid="page-form">
        <input name="title" defaultValue="kept" />
        <Modal open onClose={() => {}} label="Inner">
          <form onSubmit={inner} data-testid="inner-form">
            <input name="address" />
          </form>
        </Modal>
      </form>,
    ),
  );
  const innerForm = document.querySelector<HTMLFormElement>('[data-testid="inner-form"]')!;
  const pageForm = host.querySelector('[data-testid="page-form"]')!;
  expect(innerForm).not.toBeNull();
  expect(pageForm.contains(innerForm)).toBe(false);
  expect(innerForm.closest("dialog")?.parentElement).toBe(document.body);
  expect(innerForm.querySelector("input")!.form).toBe(innerForm);

  submitInner(innerForm);
  expect(inner).toHaveBeenCalledTimes(1);
  expect(outer).not.toHaveBeenCalled();
});

test("ConfirmDialog inside a form: Enter in its field confirms it, not the page form", () => {
  const outer = vi.fn((e: React.FormEvent) => e.preventDefault());
  const confirm = vi.fn();
  act(() =>
    root.render(
      <form onSubmit={outer}>
        <ConfirmDialog open title="Rename?" confirmLabel="Rename" onConfirm={confirm} onClose={() => {}}>
          <input aria-label="New name" />
        </ConfirmDialog>
      </form>,
    ),
  );
  const dialogForm = document.querySelector("dialog form") as HTMLFormElement;
  expect(host.contains(dialogForm)).toBe(false);
  submitInner(dialogForm);
  expect(confirm).toHaveBeenCalledTimes(1);
  expect(outer).not.toHaveBeenCalled();
});

test("a closed Modal shows nothing; opening calls showModal", () => {
  const show = vi.spyOn(HTMLDialogElement.prototype, "showModal");
  act(() => root.render(<Modal open={false} onClose={() => {}} label="Later"><p>inside</p></Modal>));
  const dialog = document.querySelector("dialog")!;
  expect(dialog.open).toBe(false);
  act(() => root.render(<Modal open onClose={() => {}} label="Later"><p>inside</p></Modal>));
  expect(show).toHaveBeenCalledTimes(1);
  expect(dialog.getAttribute("aria-label")).toBe("Later");
  show.mockRestore();
});
