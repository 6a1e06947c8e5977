import { execFileSync } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { POST } from "@/app/api/stills/route";
import { env } from "@/lib/env";
import { createPerson, ctx, uploadRequest, type TestPerson } from "./factories";
import { jpegWithMetadata, PLANTED, png16WithMetadata, tiff16WithMetadata, webpWithMetadata } from "./metadata-files";

/*
 * shared/PRODUCT.md "Confidentiality" and the OWASP File Upload Cheat Sheet: originals are
 * stored stripped of metadata, while pixels and colour information stay exactly as uploaded.
 * Checked with an independent decoder and reader, Debian's ImageMagick 6 (/usr/bin/convert and
 * /usr/bin/identify, never /usr/local/bin/convert, a stand-in): every decoded sample value, the
 * embedded ICC profile byte for byte and the bit depth of the stored original equal the
 * upload's; `identify -verbose` lists no EXIF, XMP, IPTC/8BIM or text properties on the stored
 * file (and does list them on the upload, so the check can fail); and no planted string is left
 * anywhere in its bytes.
 */

const CONVERT = "/usr/bin/convert";
const IDENTIFY = "/usr/bin/identify";
const hasImageMagick = fs.existsSync(CONVERT) && fs.existsSync(IDENTIFY);
if (!hasImageMagick && process.env.CI) throw new Error("Debian's imagemagick is missing: .ci/run installs it.");

let dir = "";
let work = "";
let senior: TestPerson;

beforeAll(async () => {
  dir = fs.mkdtempSync(path.join(os.tmpdir(), "plateroom-strip-"));
  work = fs.mkdtempSync(path.join(os.tmpdir(), "plateroom-strip-files-"));
  env.PLATEROOM_UPLOADS_DIR = dir;
  senior = await createPerson("senior");
});

afterAll(() => {
  for (const d of [dir, work]) if (d) fs.rmSync(d, { recursive: true, force: true });
});

const magick = (cmd: string, args: string[]) => execFileSync(cmd, args, { maxBuffer: 64 * 1024 * 1024 });

function onDisk(name: string, bytes: Buffer): string {
  const file = path.join(work, name);
  fs.writeFileSync(file, bytes);
  return file;
}

/** Every sample, as ImageMagick decodes it (no colour management: stored values), 16 bits each. */
const samples = (file: string) => magick(CONVERT, [file, "-depth", "16", "rgb:-"]);
/** The embedded ICC profile's bytes, as ImageMagick extracts it. */
const iccOf = (file: string) => magick(CONVERT, [file, "icc:-"]);
const depthOf = (file: string) => magick(IDENTIFY, ["-format", "%z %w %h", file]).toString().trim();
const verbose = (file: string) => magick(IDENTIFY, ["-verbose", file]).toString();

/** What identify -verbose reports as identifying metadata. */
const IDENTIFYING = [/exif:/i, /xmp/i, /iptc/i, /8bim/i, /Profile-(exif|xmp|iptc|8bim)/i, /png:(tEXt|zTXt|iTXt|eXIf|tIME)/i, /^\s*(Artist|Software|Comment|Author|Copyright):/im];

async function uploadAndReadStored(bytes: Buffer, name: string): Promise<string> {
  const res = await POST(uploadRequest({ bytes, name }, { alt: "Invented plate with metadata", owner: "trial" }, senior.auth), ctx({}));
  expect(res.status).toBe(201);
  const { sha256 } = (await res.json()) as { sha256: string };
  return path.join(dir, "originals", sha256.slice(0, 2), `${sha256}.bin`);
}

const CASES: { format: string; make: () => Promise<Buffer>; ext: string }[] = [
  { format: "JPEG (Exif with GPS, XMP, IPTC, comment, trailing bytes)", make: jpegWithMetadata, ext: "jpg" },
  { format: "16-bit PNG (tEXt, zTXt, iTXt XMP, eXIf, tIME)", make: png16WithMetadata, ext: "png" },
  { format: "16-bit TIFF (Artist, Software, HostComputer, Make/Model, GPS IFD, XMP, IPTC, Photoshop)", make: tiff16WithMetadata, ext: "tif" },
  { format: "WebP (EXIF and XMP chunks)", make: webpWithMetadata, ext: "webp" },
];

describe.skipIf(!hasImageMagick)("originals stored without identifying metadata (OWASP File Upload Cheat Sheet)", () => {
  for (const c of CASES) {
    it(`${c.format}: metadata gone, every sample, the ICC profile and the bit depth unchanged`, async () => {
      const uploaded = onDisk(`upload.${c.ext}`, await c.make());
      const stored = onDisk(`stored.${c.ext}`, fs.readFileSync(await uploadAndReadStored(fs.readFileSync(uploaded), `plate.${c.ext}`)));

      // The upload really carries what must go (so this test can fail); ImageMagick 6 names the
      // WebP chunks (Profile-exif, Profile-xmp) without reading inside them.
      const before = verbose(uploaded);
      expect(IDENTIFYING.some((re) => re.test(before))).toBe(true);
      expect(fs.readFileSync(uploaded).includes(Buffer.from(PLANTED.artist, "latin1"))).toBe(true);

      const after = verbose(stored);
      for (const re of IDENTIFYING) expect(after, String(re)).not.toMatch(re);
      const raw = fs.readFileSync(stored);
      for (const text of Object.values(PLANTED)) {
        expect(raw.includes(Buffer.from(text, "latin1")), text).toBe(false);
        expect(raw.includes(Buffer.from(text, "utf16le")), text).toBe(false);
      }

      expect(depthOf(stored)).toBe(depthOf(uploaded));
      const profile = iccOf(uploaded);
      expect(profile.length).toBeGreaterThan(100);
      expect(iccOf(stored).equals(profile)).toBe(true);
      const [a, b] = [samples(uploaded), samples(stored)];
      expect(b.length).toBe(a.length);
      expect(b.equals(a)).toBe(true);
    });
  }
});
