import type { UploadImage } from "@/components/editor/editor";

/** Uploads an image added to the write-up as a reference still of the technique, with the description its author gave. */
export async function uploadStillForEditor(file: File, alt: string, slug: string): ReturnType<UploadImage> {
  const form = new FormData();
  form.set("file", file);
  form.set("alt", alt);
  form.set("technique", slug);
  form.set("role", "reference");
  form.set("owner", "technique");
  const res = await fetch("/api/stills", { method: "POST", body: form, credentials: "same-origin" });
  const body = (await res.json().catch(() => null)) as { id?: string; error?: { message?: string } } | null;
  if (!res.ok || !body?.id) throw new Error(body?.error?.message ?? `Upload failed (${res.status}).`);
  return { stillId: body.id };
}
