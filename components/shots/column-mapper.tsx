"use client";

import { Select } from "@/components/ui/field";
import { SHOT_FIELD_LABELS, SHOT_FIELDS, type ColumnMapping, type ShotField } from "@/lib/shots/schemas";

/** One select per CSV header: which shot field it feeds, or none. A field takes one header. */
export function ColumnMapper({
  headers,
  sample,
  mapping,
  onChange,
}: {
  headers: string[];
  sample?: Record<string, string>;
  mapping: ColumnMapping | null;
  onChange: (mapping: ColumnMapping | null) => void;
}) {
  const fieldOf = (header: string): ShotField | "" => SHOT_FIELDS.find((f) => mapping?.[f] === header) ?? "";

  function assign(header: string, field: ShotField | "") {
    const next: Partial<Record<ShotField, string | null>> = { ...(mapping ?? {}) };
    for (const f of SHOT_FIELDS) if (next[f] === header) next[f] = null;
    if (field) next[field] = header;
    onChange(next.code ? { ...next, code: next.code } : toLoose(next));
  }

  return (
    <table className="w-full text-sm">
      <caption className="mb-2 text-left font-medium">Map columns</caption>
      <thead className="text-left text-xs text-muted">
        <tr>
          <th className="py-1 pr-2 font-normal">Column in the file</th>
          <th className="py-1 pr-2 font-normal">First value</th>
          <th className="py-1 font-normal">Imports as</th>
        </tr>
      </thead>
      <tbody>
        {headers.map((h, i) => (
          <tr key={h} className="border-t border-line">
            <td className="py-1 pr-2 font-mono text-xs">{h}</td>
            <td className="max-w-48 truncate py-1 pr-2 text-xs text-muted">{sample?.[h] ?? ""}</td>
            <td className="py-1">
              <Select aria-label={`Field for column ${h}`} id={`map-${i}`} value={fieldOf(h)} onChange={(e) => assign(h, e.target.value as ShotField | "")}>
                <option value="">— not imported —</option>
                {SHOT_FIELDS.map((f) => (
                  <option key={f} value={f}>
                    {SHOT_FIELD_LABELS[f]}
                  </option>
                ))}
              </Select>
            </td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}

/**
 * Without a code column the mapping is incomplete; it is kept (so other choices survive) as a
 * mapping whose code names no header, which readShotCsv reports as a file problem.
 */
function toLoose(next: Partial<Record<ShotField, string | null>>): ColumnMapping | null {
  return Object.values(next).some(Boolean) ? { ...next, code: "" } : null;
}
