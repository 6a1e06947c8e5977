/*
 * `npm run wasm`: compiles every lib/lab/wasm/<name>.wat into lib/lab/wasm/<name>.wasm (committed;
 * the engine loads those, and tests/unit/lab/wasm-binaries.test.ts fails when one is stale).
 */
import fs from "node:fs";
import path from "node:path";
import { compileWat, WASM_DIR, watSources } from "@/scripts/lib/wat";

for (const name of watSources()) {
  const bytes = await compileWat(name, fs.readFileSync(path.join(WASM_DIR, `${name}.wat`), "utf8"));
  const out = path.join(WASM_DIR, `${name}.wasm`);
  const old = fs.existsSync(out) ? fs.readFileSync(out) : null;
  if (old && Buffer.compare(old, bytes) === 0) {
    console.log(`${name}.wasm up to date (${bytes.length} bytes)`);
    continue;
  }
  fs.writeFileSync(out, bytes);
  console.log(`wrote lib/lab/wasm/${name}.wasm (${bytes.length} bytes)`);
}
