import { Matrix, pseudoInverse, solve } from "ml-matrix";
import { CHANNEL_INDEX, type Channel, type LabSolveResponse } from "@/lib/lab/recipe";

/*
 * Matrix solver (LAB-NOTES.md "Solver"). Only the target channel's row is replaced: solving all
 * three rows from two marker shades gives a rank-1 matrix that wrecks every other colour.
 *  hide:  r = e_c + d, d = pinv(D·P)·b with rows of D = (m_i − s), b_i = −(m_i − s)_c and
 *         P = I − s sᵀ/(sᵀs): r·s = s_c exactly and d is the minimum-norm change.
 *  matte: r = pinv(M·P)·1 (r·s = 0 exactly, markers → 1 in least squares, minimum norm),
 *         or ridge-regularised when `ridge` > 0.
 * Client-safe: pure maths on ml-matrix.
 */

export type Rgb = readonly [number, number, number] | readonly number[];
type SolveGoal = { kind: "hide" | "matte"; channel: Channel };
type SolveInput = { markers: readonly Rgb[]; screen: readonly Rgb[]; goal: SolveGoal; ridge?: number };

function meanRgb(samples: readonly Rgb[]): [number, number, number] {
  const s: [number, number, number] = [0, 0, 0];
  for (const v of samples) for (let i = 0; i < 3; i++) s[i] = s[i]! + v[i]! / samples.length;
  return s;
}

function projector(s: readonly number[]): Matrix {
  const ss = s[0]! * s[0]! + s[1]! * s[1]! + s[2]! * s[2]!;
  const P = Matrix.eye(3, 3);
  if (ss === 0) return P;
  for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) P.set(i, j, P.get(i, j) - (s[i]! * s[j]!) / ss);
  return P;
}

const dot = (a: readonly number[], b: readonly number[]): number => a[0]! * b[0]! + a[1]! * b[1]! + a[2]! * b[2]!;

export function solveRow(input: SolveInput): LabSolveResponse {
  const { markers, goal } = input;
  const c = CHANNEL_INDEX[goal.channel];
  const s = meanRgb(input.screen);
  const P = projector(s);
  let row: [number, number, number];
  let perShade: number[];
  if (goal.kind === "hide") {
    const D = new Matrix(markers.map((m) => [m[0] - s[0], m[1] - s[1], m[2] - s[2]]));
    const b = Matrix.columnVector(markers.map((m) => -(m[c] - s[c])));
    const d = pseudoInverse(D.mmul(P)).mmul(b);
    row = [d.get(0, 0), d.get(1, 0), d.get(2, 0)];
    row[c] += 1;
    perShade = markers.map((m) => dot(row, m) - dot(row, s));
  } else {
    const M = new Matrix(markers.map((m) => [m[0], m[1], m[2]]));
    const ones = Matrix.columnVector(markers.map(() => 1));
    const MP = M.mmul(P);
    let x: Matrix;
    if (input.ridge && input.ridge > 0) {
      // min ‖MP x − 1‖² + λ‖x‖²; P x keeps r·s = 0.
      const A = MP.transpose().mmul(MP).add(Matrix.eye(3, 3).mul(input.ridge));
      x = P.mmul(solve(A, MP.transpose().mmul(ones)));
    } else {
      x = pseudoInverse(MP).mmul(ones);
    }
    row = [x.get(0, 0), x.get(1, 0), x.get(2, 0)];
    perShade = [...markers.map((m) => dot(row, m) - 1), ...input.screen.map((v) => dot(row, v))];
  }
  const residual = Math.sqrt(perShade.reduce((a, v) => a + v * v, 0) / perShade.length);
  const matrix: LabSolveResponse["matrix"] = [
    [1, 0, 0],
    [0, 1, 0],
    [0, 0, 1],
  ];
  matrix[c] = [...row];
  return { row, matrix, residual, perShade, noiseGain: Math.hypot(row[0], row[1], row[2]) };
}
