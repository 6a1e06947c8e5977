"use client";

import { useMemo, useState } from "react";
import { useDropzone } from "react-dropzone";
import { Button } from "@/components/ui/button";
import { TextArea } from "@/components/ui/field";
import { ApiError, apiFetch } from "@/lib/api/fetcher";
import { guessMapping, readShotCsv } from "@/lib/shots/csv";
import type { ColumnMapping, ImportShotsResponse } from "@/lib/shots/schemas";
import { cn } from "@/lib/utils";
import { ColumnMapper } from "./column-mapper";
import { ImportPreview } from "./import-preview";

type Step = "source" | "map" | "preview" | "done";

/**
 * Import a shot list into a show: paste or drop a CSV, map its columns, read the dry-run
 * preview (new, changed, unchanged, errors with reasons), then commit. The server plans with
 * the same code as the local read, so the preview is what will be written.
 */
export function ShotImport({ showCode, onImported }: { showCode: string; onImported?: (result: ImportShotsResponse) => void }) {
  const [text, setText] = useState("");
  const [mapping, setMapping] = useState<ColumnMapping | null>(null);
  const [step, setStep] = useState<Step>("source");
  const [plan, setPlan] = useState<ImportShotsResponse | null>(null);
  const [result, setResult] = useState<ImportShotsResponse | null>(null);
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);

  const read = useMemo(() => (text ? readShotCsv(text, mapping) : null), [text, mapping]);

  function load(csv: string) {
    setText(csv);
    const headers = readShotCsv(csv, null).headers;
    setMapping(guessMapping(headers));
    setPlan(null);
    setResult(null);
    setError(null);
    setStep(csv ? "map" : "source");
  }

  const dropzone = useDropzone({
    accept: { "text/csv": [".csv"], "text/plain": [".txt"] },
    multiple: false,
    onDropAccepted: async ([file]) => file && load(await file.text()),
    onDropRejected: () => setError("Drop a single .csv file."),
  });

  async function send(dryRun: boolean) {
    if (!mapping) return;
    setBusy(true);
    setError(null);
    try {
      const res = await apiFetch<ImportShotsResponse>(`/api/shows/${encodeURIComponent(showCode)}/shots`, {
        method: "POST",
        json: { csv: text, mapping, dryRun },
      });
      if (dryRun) {
        setPlan(res);
        setStep("preview");
      } else {
        setResult(res);
        setStep("done");
        onImported?.(res);
      }
    } catch (e) {
      setError(e instanceof ApiError ? e.message : "The import failed. Nothing was written.");
    } finally {
      setBusy(false);
    }
  }

  return (
    <section className="space-y-4 rounded border border-line bg-surface p-4" aria-label={`Import shots into ${showCode}`}>
      <ol className="flex gap-4 text-xs text-muted">
        {(["source", "map", "preview", "done"] as const).map((s, i) => (
          <li key={s} className={cn(step === s && "font-semibold text-accent")}>
            {i + 1}. {{ source: "Paste or drop", map: "Map columns", preview: "Preview", done: "Imported" }[s]}
          </li>
        ))}
      </ol>

      {step === "source" || step === "map" ? (
        <div className="space-y-2">
          <div
            {...dropzone.getRootProps()}
            className={cn("cursor-pointer rounded border border-dashed border-line bg-surface-2 p-4 text-center text-sm text-muted", dropzone.isDragActive && "border-accent text-accent")}
          >
            <input {...dropzone.getInputProps()} aria-label="Shot list file" />
            Drop a shot list (.csv) here, or click to choose one.
          </div>
          <label htmlFor="shot-import-text" className="block text-sm font-medium">
            Or paste CSV text (first row: column names)
          </label>
          <TextArea id="shot-import-text" className="min-h-32 font-mono text-xs" value={text} onChange={(e) => load(e.target.value)} spellCheck={false} />
        </div>
      ) : null}

      {step === "map" && read ? (
        <>
          <ColumnMapper headers={read.headers} sample={read.rows[0]?.raw} mapping={mapping} onChange={setMapping} />
          {read.fileErrors.map((m) => (
            <p key={m} role="alert" className="text-sm text-bad">
              {m}
            </p>
          ))}
          <p className="text-sm text-muted">
            {countOf(read.rows.length, "row")} read{read.errors.length ? `, ${read.errors.length} unreadable` : ""}.
          </p>
          <Button variant="primary" disabled={busy || !mapping || read.fileErrors.length > 0} onClick={() => send(true)}>
            {busy ? "Checking…" : "Preview import"}
          </Button>
        </>
      ) : null}

      {step === "preview" && plan ? (
        <>
          <ImportPreview plan={plan} />
          <div className="flex gap-2">
            <Button onClick={() => setStep("map")} disabled={busy}>
              Back to mapping
            </Button>
            <Button variant="primary" disabled={busy || plan.created + plan.updated === 0} onClick={() => send(false)}>
              {busy ? "Importing…" : `Import ${plan.created} new and ${plan.updated} changed ${plan.created + plan.updated === 1 ? "shot" : "shots"}`}
            </Button>
          </div>
        </>
      ) : null}

      {step === "done" && result ? (
        <div role="status" className="space-y-2 text-sm">
          <p>
            Imported: {result.created} new, {result.updated} changed, {result.unchanged} unchanged.
            {result.errors.length ? ` ${countOf(result.errors.length, "row")} ${result.errors.length === 1 ? "was" : "were"} not imported:` : ""}
          </p>
          {result.errors.length ? <ImportPreview plan={result} errorsOnly /> : null}
          <Button onClick={() => load("")}>Import another list</Button>
        </div>
      ) : null}

      {error ? (
        <p role="alert" className="text-sm text-bad">
          {error}
        </p>
      ) : null}
    </section>
  );
}

/** "1 row", "2 rows". */
function countOf(n: number, noun: string): string {
  return `${n} ${n === 1 ? noun : `${noun}s`}`;
}
