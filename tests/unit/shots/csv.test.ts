import Papa from "papaparse";
import { describe, expect, it } from "vitest";
import { csvRecordsToRows, guessMapping, planImport, readShotCsv, shotsToCsv, type ExistingShot, type ExportableShot, type ImportRow } from "@/lib/shots/csv";
import { DEFAULT_SHOT_PATTERN } from "@/lib/shows/schemas";

// Shot codes SHOW_SEQ_SHOT (e.g. SLM_040_0120): common practice, no published source.
// CSV syntax (quotes, doubled quotes, CRLF records, header row): RFC 4180, sections 2.1–2.7.
const SLM = { code: "SLM", shotPattern: DEFAULT_SHOT_PATTERN };
const noShots = new Map<string, ExistingShot>();

describe("readShotCsv", () => {
  it("strips a UTF-8 byte order mark so the first header is recognised", () => {
    // The BOM is U+FEFF at the start of the text (Unicode Standard, section 23.8).
    const r = readShotCsv("\uFEFFShot,Description\nSLM_040_0120,markers on screen\n");
    expect(r.headers).toEqual(["Shot", "Description"]);
    expect(r.mapping?.code).toBe("Shot");
    expect(r.rows[0]?.values.code).toBe("SLM_040_0120");
  });

  it("keeps commas, doubled quotes and line breaks inside quoted fields (RFC 4180 2.6, 2.7)", () => {
    const text = 'Shot,Description\r\nSLM_040_0120,"wire, rig and ""dots""\r\nacross frame"\r\n';
    const r = readShotCsv(text);
    expect(r.errors).toEqual([]);
    expect(r.rows).toHaveLength(1);
    expect(r.rows[0]?.values.description).toBe('wire, rig and "dots"\r\nacross frame');
  });

  it("reads CRLF files like LF files and skips blank lines and rows of bare commas", () => {
    const lf = "Shot,Frame start,Frame end\n\nSLM_040_0120,1001,1096\n,,\nSLM_040_0130,1001,1050\n\n";
    const crlf = lf.replaceAll("\n", "\r\n");
    for (const text of [lf, crlf]) {
      const r = readShotCsv(text);
      expect(r.rows.map((x) => x.values)).toEqual([
        { code: "SLM_040_0120", frameStart: "1001", frameEnd: "1096" },
        { code: "SLM_040_0130", frameStart: "1001", frameEnd: "1050" },
      ]);
      // Data rows count from 1 below the header; lines count every physical line (header = 1).
      expect(r.rows.map((x) => [x.row, x.line])).toEqual([
        [1, 3],
        [2, 5],
      ]);
    }
  });

  it("counts lines after a quoted line break correctly", () => {
    const r = readShotCsv('Shot,Description\n"SLM_040_0120","two\nlines"\nSLM_040_0130,x\n');
    expect(r.rows.map((x) => [x.row, x.line])).toEqual([
      [1, 2],
      [2, 4],
    ]);
  });

  it("reports a row with more cells than headers and an unterminated quote", () => {
    const r = readShotCsv('Shot,Description\nSLM_040_0120,a,b\nSLM_040_0130,ok\nSLM_040_0140,"open\n');
    expect(r.rows.map((x) => x.values.code)).toEqual(["SLM_040_0130"]);
    expect(r.errors.map((e) => e.row)).toEqual([1, 3]);
    expect(r.errors[0]?.message).toMatch(/3 cells but the header has 2/);
  });

  it("says so when no column looks like a shot code, or a mapped column is missing", () => {
    expect(readShotCsv("Foo,Bar\n1,2\n").fileErrors[0]).toMatch(/No column for the shot code/);
    expect(readShotCsv("Foo,Bar\n1,2\n", { code: "Shot" }).fileErrors[0]).toMatch(/"Shot" is not in the file/);
    expect(readShotCsv("").fileErrors[0]).toMatch(/no header row/);
  });

  it("applies an explicit mapping", () => {
    const r = readShotCsv("Plate,Notes,In,Out\nSLM_040_0120,dust,1001,1010\n", {
      code: "Plate",
      description: "Notes",
      frameStart: "In",
      frameEnd: "Out",
    });
    expect(r.rows[0]?.values).toEqual({ code: "SLM_040_0120", description: "dust", frameStart: "1001", frameEnd: "1010" });
  });
});

describe("guessMapping", () => {
  it("recognises common header spellings, each header used once", () => {
    expect(guessMapping(["Shot Code", "Seq", "Cut In", "Cut Out", "Status", "Description"])).toEqual({
      code: "Shot Code",
      sequence: "Seq",
      frameStart: "Cut In",
      frameEnd: "Cut Out",
      state: "Status",
      description: "Description",
    });
    expect(guessMapping(["Foo"])).toBeNull();
  });
});

describe("planImport", () => {
  const rowsOf = (text: string): ImportRow[] => csvRecordsToRows(readShotCsv(text).rows);

  it("sorts rows into new, changed and unchanged against the stored shots", () => {
    const existing = new Map<string, ExistingShot>([
      ["SLM_040_0120", { code: "SLM_040_0120", showCode: "SLM", sequence: "040", description: "markers", frameStart: 1001, frameEnd: 1096, state: "waiting" }],
      ["SLM_040_0130", { code: "SLM_040_0130", showCode: "SLM", sequence: "040", description: "wire", frameStart: 1001, frameEnd: 1050, state: "in_prep" }],
    ]);
    const plan = planImport(
      rowsOf("Shot,Description,Frame start,Frame end,State\nSLM_040_0120,markers,1001,1096,\nSLM_040_0130,wire and rig,,,\nSLM_050_0010,dust,1001,1020,In prep\n"),
      existing,
      SLM,
    );
    expect(plan.errors).toEqual([]);
    expect(plan.unchanged).toEqual([{ row: 1, code: "SLM_040_0120" }]);
    // Blank cells keep the stored frames and state; only the description changes.
    expect(plan.update).toHaveLength(1);
    expect(plan.update[0]?.changes).toEqual({ description: "wire and rig" });
    expect(plan.update[0]?.previous).toEqual({ description: "wire" });
    // The sequence comes from the middle part of SHOW_SEQ_SHOT when no column gives it.
    expect(plan.create).toEqual([
      { row: 3, code: "SLM_050_0010", sequence: "050", description: "dust", frameStart: 1001, frameEnd: 1020, state: "in_prep" },
    ]);
  });

  it("reports duplicate codes after the first, naming the first row", () => {
    const plan = planImport(rowsOf("Shot\nSLM_040_0120\nSLM_040_0130\nSLM_040_0120\nSLM_040_0120\n"), noShots, SLM);
    expect(plan.create.map((s) => s.row)).toEqual([1, 2]);
    expect(plan.errors.map((e) => [e.row, e.message])).toEqual([
      [3, "SLM_040_0120 appears more than once; first on row 1."],
      [4, "SLM_040_0120 appears more than once; first on row 1."],
    ]);
  });

  it("rejects codes that break the show's pattern, bad frames and other shows' shots", () => {
    const existing = new Map<string, ExistingShot>([
      ["SLM_010_0010", { code: "SLM_010_0010", showCode: "LTH", sequence: "010", description: "", frameStart: null, frameEnd: null, state: "waiting" }],
    ]);
    const plan = planImport(
      rowsOf(
        [
          "Shot,Frame start,Frame end,State",
          "SLM_40_120,1,2,", // sequence and shot too short for SHOW_SEQ_SHOT
          "LTH_040_0120,1,2,", // another show's code
          "slm_040_0120,1,2,", // lower case does not match
          "SLM_040_0140,1100,1001,", // ends before it starts
          "SLM_040_0150,10.5,20,",
          "SLM_040_0160,1,2,finished",
          "SLM_010_0010,,,",
          "SLM_040_0170,1001,1001,", // a single-frame shot is fine
        ].join("\n"),
      ),
      existing,
      SLM,
    );
    expect(plan.create.map((s) => s.code)).toEqual(["SLM_040_0170"]);
    expect(plan.errors.map((e) => e.row)).toEqual([1, 2, 3, 4, 5, 6, 7]);
    // Said in words with an example, never as the pattern (issue 13).
    expect(plan.errors[0]?.message).toBe("SLM_40_120 is not a shot code of SLM: they look like SLM_040_0120 (the show, a 3-digit sequence, a 4-digit shot, joined by underscores).");
    expect(plan.errors.map((e) => e.message).join(" ")).not.toMatch(/\\d|\^|\$|\{\d/);
    expect(plan.errors[3]?.message).toMatch(/Frame start 1100 is after frame end 1001/);
    expect(plan.errors[4]?.message).toMatch(/whole numbers/);
    expect(plan.errors[5]?.message).toMatch(/State must be one of/);
    expect(plan.errors[6]?.message).toMatch(/already belongs to show LTH/);
  });

  it("checks a frame range against the stored frame where the row gives only one end", () => {
    const existing = new Map<string, ExistingShot>([
      ["SLM_040_0120", { code: "SLM_040_0120", showCode: "SLM", sequence: "040", description: "", frameStart: 1001, frameEnd: 1096, state: "waiting" }],
    ]);
    const plan = planImport([{ row: 1, values: { code: "SLM_040_0120", frameEnd: 900 } }], existing, SLM);
    expect(plan.errors[0]?.message).toBe("Frame start 1001 is after frame end 900.");
  });

  it("plans a 10,000-row file in one pass: row and lookup accesses grow linearly", () => {
    // Counting accesses instead of timing: a quadratic duplicate scan would read rows ~n²/2 times.
    const n = 10_000;
    const lines = ["Shot,Description,Frame start,Frame end"];
    for (let i = 0; i < n; i++) lines.push(`SLM_${String(Math.floor(i / 1000)).padStart(3, "0")}_${String(i % 1000).padStart(4, "0")},"plate, ${i}",1001,${1001 + (i % 200)}`);
    lines.push("SLM_000_0000,again,1,2"); // duplicate of row 1
    const read = readShotCsv(lines.join("\r\n"));
    expect(read.rows).toHaveLength(n + 1);

    let rowReads = 0;
    const rows = new Proxy(csvRecordsToRows(read.rows), {
      get(target, key, receiver) {
        if (typeof key === "string" && /^\d+$/.test(key)) rowReads++;
        return Reflect.get(target, key, receiver);
      },
    });
    let lookups = 0;
    class CountingMap extends Map<string, ExistingShot> {
      override get(k: string) {
        lookups++;
        return super.get(k);
      }
      override has(k: string) {
        lookups++;
        return super.has(k);
      }
    }
    const plan = planImport(rows, new CountingMap(), SLM);
    expect(plan.create).toHaveLength(n);
    expect(plan.errors).toEqual([{ row: n + 1, line: n + 2, code: "SLM_000_0000", message: "SLM_000_0000 appears more than once; first on row 1." }]);
    expect(rowReads).toBeLessThanOrEqual(n + 1);
    expect(lookups).toBeLessThanOrEqual(n + 1);
  });
});

describe("shotsToCsv", () => {
  const shots: ExportableShot[] = [
    { code: "SLM_040_0120", sequence: "040", description: 'markers, "dots" and\na wire', frameStart: 1001, frameEnd: 1096, state: "in_prep" },
    { code: "SLM_040_0130", sequence: "040", description: "=SUM(A1) -2 stops", frameStart: null, frameEnd: null, state: "waiting" },
    { code: "SLM_040_0140", sequence: "040", description: "-2 stops under", frameStart: 0, frameEnd: 0, state: "on_hold" },
  ];

  it("round-trips through the reader and the planner unchanged", () => {
    const csv = shotsToCsv(shots);
    const read = readShotCsv(csv);
    expect(read.errors).toEqual([]);
    const existing = new Map(shots.map((s) => [s.code, { ...s, showCode: "SLM" }]));
    const plan = planImport(csvRecordsToRows(read.rows), existing, SLM);
    expect(plan.unchanged.map((u) => u.code)).toEqual(shots.map((s) => s.code));
    expect(plan.update).toEqual([]);
    expect(plan.errors).toEqual([]);
  });

  it("writes RFC 4180 CSV that papaparse reads back, with formula cells neutralised", () => {
    const csv = shotsToCsv(shots);
    expect(csv.startsWith("Shot,Sequence,Description,Frame start,Frame end,State\r\n")).toBe(true);
    // Read back with papaparse directly: the cell a spreadsheet would evaluate starts with "'"
    // (OWASP, "CSV Injection": prefix cells beginning with = + - @ tab or CR).
    const parsed = Papa.parse<string[]>(csv, { skipEmptyLines: true });
    expect(parsed.data[1]?.[2]).toBe('markers, "dots" and\na wire');
    expect(parsed.data[2]?.[2]).toBe("'=SUM(A1) -2 stops");
    expect(parsed.data[2]?.[3]).toBe("");
  });
});
