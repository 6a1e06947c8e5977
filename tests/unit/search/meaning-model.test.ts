import { describe, expect, it, vi } from "vitest";

// When the encoder's package cannot load (a broken install, a platform without WebAssembly SIMD),
// search must keep working by words: the encoder is null and nothing throws.
vi.mock("@energetic-ai/embeddings", () => ({
  initModel: () => Promise.reject(new Error("no model here")),
}));

// The model is remembered on globalThis (one per process); start and leave this file without one.
const forget = () => delete (globalThis as { plateroomMeaningModel?: unknown }).plateroomMeaningModel;

describe("sentenceEncoder when the model cannot load", () => {
  it("answers null and says why once on the console", async () => {
    forget();
    const errors = vi.spyOn(console, "error").mockImplementation(() => undefined);
    const { sentenceEncoder } = await import("@/lib/search/meaning-model");
    expect(await sentenceEncoder()).toBeNull();
    expect(await sentenceEncoder()).toBeNull();
    expect(errors).toHaveBeenCalledTimes(1);
    expect(String(errors.mock.calls[0]?.[0])).toContain("sentence encoder did not load");
    errors.mockRestore();
    forget();
  });
});
