import { blurPlane, morphPlane, gaussianKernel } from "@/lib/lab/kernels";
const W = 2048, H = 1080, n = W * H;
const p = new Float32Array(n); for (let i = 0; i < n; i++) p[i] = Math.random();
const tmp = new Float32Array(n);
for (const s of [1.2, 1.2, 1.2, 5, 40]) { const t = performance.now(); blurPlane(p, W, H, s, tmp); console.log("blur", s, performance.now() - t); }
for (const r of [2, 2, 16]) { const t = performance.now(); morphPlane(p, W, H, r); console.log("morph", r, performance.now() - t); }
