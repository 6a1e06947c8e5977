"use client";

import { useEffect, useId, useState } from "react";
import { inputClasses } from "@/components/ui/field";
import { readPixel, type PixelReading } from "@/components/stills/pixel-source";
import { channelLabels, formatFloat, pixelAt, pointOf, type ProbePoint } from "@/lib/stills/probe";
import type { StillResponse } from "@/lib/stills/schemas";

type PixelProbeProps = {
  before: StillResponse;
  after: StillResponse;
  /** Where the pointer is, relative to the image (0..1); null before the first move. */
  point: ProbePoint | null;
  /** Typed coordinates move the probe too (keyboard access). */
  onPointChange: (point: ProbePoint) => void;
};

/** Channel values under the cursor for before and after: code values and 0..1 floats. */
export function PixelProbe({ before, after, point, onPointChange }: PixelProbeProps) {
  const id = useId();
  const at = point ? pixelAt(point, before.width, before.height) : null;

  return (
    <section aria-label="Pixel probe" className="space-y-2 rounded border border-line bg-surface-2 p-3 text-sm">
      <div className="flex flex-wrap items-end gap-3">
        <h3 className="mr-auto font-medium">Pixel probe</h3>
        {(["x", "y"] as const).map((axis) => (
          <div key={axis} className="flex items-center gap-1">
            <label htmlFor={`${id}-${axis}`} className="text-xs text-muted">
              {axis}
            </label>
            <input
              id={`${id}-${axis}`}
              type="number"
              min={0}
              max={(axis === "x" ? before.width : before.height) - 1}
              className={`${inputClasses} w-24 font-mono`}
              value={at ? at[axis] : ""}
              placeholder="—"
              onChange={(e) => {
                const n = Math.max(0, Math.floor(Number(e.target.value) || 0));
                const x = axis === "x" ? n : (at?.x ?? 0);
                const y = axis === "y" ? n : (at?.y ?? 0);
                onPointChange(pointOf(Math.min(x, before.width - 1), Math.min(y, before.height - 1), before.width, before.height));
              }}
            />
          </div>
        ))}
      </div>
      {point ? (
        <table className="w-full font-mono text-xs tabular-nums">
          <thead>
            <tr className="text-left text-muted">
              <th scope="col" className="py-1 pr-3 font-normal">
                Still
              </th>
              <th scope="col" className="py-1 pr-3 font-normal">
                Pixel
              </th>
              <th scope="col" className="py-1 font-normal">
                Channel: code value / 0..1
              </th>
            </tr>
          </thead>
          <tbody>
            <ProbeRow label="Before" still={before} point={point} />
            <ProbeRow label="After" still={after} point={point} />
          </tbody>
        </table>
      ) : (
        <p className="text-xs text-muted">Move the pointer over the still, or type a pixel position.</p>
      )}
    </section>
  );
}

function ProbeRow({ label, still, point }: { label: string; still: StillResponse; point: ProbePoint }) {
  const { x, y } = pixelAt(point, still.width, still.height);
  const [reading, setReading] = useState<PixelReading | null>(null);
  const [error, setError] = useState<string | null>(null);

  useEffect(() => {
    const controller = new AbortController();
    // A short pause lets fast pointer moves collapse into one server read.
    const timer = setTimeout(() => {
      readPixel(still, x, y, controller.signal)
        .then((r) => {
          setReading(r);
          setError(null);
        })
        .catch((e: unknown) => {
          if (!controller.signal.aborted) setError(e instanceof Error ? e.message : "Could not read the pixel.");
        });
    }, 30);
    return () => {
      clearTimeout(timer);
      controller.abort();
    };
  }, [still, x, y]);

  const labels = channelLabels(still.channels);
  const current = reading && reading.x === x && reading.y === y ? reading : null;
  return (
    <tr className="border-t border-line align-top">
      <th scope="row" className="py-1 pr-3 text-left font-medium">
        {label} <span className="font-normal text-muted">({still.bitDepth === 32 ? "float" : `${still.bitDepth}-bit`})</span>
      </th>
      <td className="py-1 pr-3">
        {x}, {y}
      </td>
      <td className="py-1">
        {error ? (
          <span className="text-bad">{error}</span>
        ) : current ? (
          <span className="flex flex-wrap gap-x-4">
            {current.values.map((v, i) => (
              <span key={labels[i] ?? i}>
                {labels[i]} {current.max === 1 ? v.toFixed(6) : v} / {formatFloat(v, current.max)}
              </span>
            ))}
          </span>
        ) : (
          <span className="text-muted">reading…</span>
        )}
      </td>
    </tr>
  );
}
