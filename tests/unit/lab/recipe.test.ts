import { describe, expect, it } from "vitest";
import { canonicalJson, labRunRequestSchema, labSolveRequestSchema, recipeSchema } from "@/lib/lab/recipe";

// Validation contract: API.md "The lab" — every step validated, errors name the step's index.
function issuesOf(body: unknown) {
  const r = labRunRequestSchema.safeParse(body);
  expect(r.success).toBe(false);
  return r.success ? [] : r.error.issues;
}

const ok = { op: "matrix", m: [[1, 0, 0], [0, 1, 0], [0, 0, 1]] };

describe("lab run request schema", () => {
  it("accepts the API.md example and fills defaults", () => {
    const r = labRunRequestSchema.parse({
      still: "abc",
      steps: [{ ...ok, offset: [0, 0, 0] }, { op: "copy", from: "r", to: "g" }],
    });
    expect(r.space).toBe("linear");
    expect(r.format).toBe("png16");
    expect(r.steps).toHaveLength(2);
  });

  it("rejects an unknown op with the step index in the path", () => {
    const issues = issuesOf({ still: "a", steps: [ok, ok, { op: "sharpen", amount: 2 }] });
    expect(issues[0]!.path.slice(0, 2)).toEqual(["steps", 2]);
  });

  it("rejects a 4×4 matrix at steps[i].m", () => {
    const m4 = [[1, 0, 0, 0], [0, 1, 0, 0], [0, 0, 1, 0], [0, 0, 0, 1]];
    const issues = issuesOf({ still: "a", steps: [{ op: "copy", from: "r", to: "g" }, { op: "matrix", m: m4 }] });
    expect(issues.some((i) => i.path[0] === "steps" && i.path[1] === 1 && i.path[2] === "m")).toBe(true);
  });

  it("rejects a channel that does not exist", () => {
    const issues = issuesOf({ still: "a", steps: [{ op: "copy", from: "a", to: "g" }] });
    expect(issues[0]!.path).toEqual(["steps", 0, "from"]);
  });

  it("rejects a negative or absurd sigma and radius", () => {
    const neg = issuesOf({ still: "a", steps: [{ op: "matte", channel: "g", black: 0, white: 1 }, { op: "soften", sigma: -1 }] });
    expect(neg[0]!.path).toEqual(["steps", 1, "sigma"]);
    const huge = issuesOf({ still: "a", steps: [{ op: "matte", channel: "g", black: 0, white: 1 }, { op: "soften", sigma: 5000 }] });
    expect(huge[0]!.path).toEqual(["steps", 1, "sigma"]);
    const grow = issuesOf({ still: "a", steps: [{ op: "matte", channel: "g", black: 0, white: 1 }, { op: "grow", px: 9999 }] });
    expect(grow[0]!.path).toEqual(["steps", 1, "px"]);
  });

  it("rejects NaN, Infinity and strings as numbers", () => {
    for (const bad of [NaN, Infinity, "1"]) {
      const issues = issuesOf({ still: "a", steps: [{ op: "matrix", m: [[1, 0, 0], [0, bad, 0], [0, 0, 1]] }] });
      expect(issues[0]!.path).toEqual(["steps", 0, "m", 1, 1]);
    }
  });

  it("rejects matte users before any matte step, naming that step", () => {
    const issues = issuesOf({ still: "a", steps: [ok, { op: "mix" }] });
    expect(issues[0]!.path).toEqual(["steps", 1, "op"]);
  });

  it("rejects a second grain step", () => {
    const g = { op: "grain", denoised: "d" };
    expect(issuesOf({ still: "a", steps: [g, g] })[0]!.path).toEqual(["steps", 1, "op"]);
  });

  it("rejects a format or space outside the contract", () => {
    expect(issuesOf({ still: "a", steps: [], format: "tiff" })[0]!.path).toEqual(["format"]);
    expect(issuesOf({ still: "a", steps: [], space: "log" })[0]!.path).toEqual(["space"]);
  });
});

describe("lab solve request schema", () => {
  it("accepts the API.md example", () => {
    expect(
      labSolveRequestSchema.safeParse({
        markers: [[0.15, 0.5, 0.45], [0.2, 0.55, 0.5]],
        screen: [[0.1, 0.6, 0.2]],
        goal: { kind: "hide", channel: "r" },
      }).success,
    ).toBe(true);
  });
  it("rejects two-value samples and unknown goals", () => {
    expect(labSolveRequestSchema.safeParse({ markers: [[0.1, 0.2]], screen: [[0, 0, 0]], goal: { kind: "hide", channel: "r" } }).success).toBe(false);
    expect(labSolveRequestSchema.safeParse({ markers: [[0.1, 0.2, 0.3]], screen: [[0, 0, 0]], goal: { kind: "erase", channel: "r" } }).success).toBe(false);
  });
});

describe("canonicalJson", () => {
  it("is independent of key order, so equal recipes hash equally", () => {
    const a = recipeSchema.parse([{ op: "copy", from: "r", to: "g" }]);
    const b = recipeSchema.parse([{ to: "g", from: "r", op: "copy" }]);
    expect(canonicalJson(a)).toBe(canonicalJson(b));
    expect(canonicalJson({ b: 1, a: [1, { d: 2, c: 3 }] })).toBe('{"a":[1,{"c":3,"d":2}],"b":1}');
  });
});
