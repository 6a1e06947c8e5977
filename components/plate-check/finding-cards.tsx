import type { ReactNode } from "react";
import { Badge } from "@/components/ui/badge";
import { confidenceWord, displayHex, fixed, percent } from "@/lib/plate-check/format";
import type { Findings, TagReason } from "@/lib/plate-check/schemas";

type Props = { findings: Findings; tagNames: Record<string, string> };

function Finding({ title, confidence, summary, tags, tagNames, children }: { title: string; confidence: number; summary: string; tags: TagReason[]; tagNames: Record<string, string>; children?: ReactNode }) {
  return (
    <li className="rounded border border-line bg-surface p-3">
      <div className="flex flex-wrap items-center gap-2">
        <h3 className="font-semibold">{title}</h3>
        <span className="ml-auto text-xs text-muted" title="How sure the check is of this finding">
          {confidenceWord(confidence)} ({Math.round(confidence * 100)} %)
        </span>
      </div>
      <p className="mt-1 text-sm">{summary}</p>
      {children ? <div className="mt-2 text-sm">{children}</div> : null}
      {tags.length ? (
        <p className="mt-2 flex flex-wrap gap-1 text-xs">
          <span className="text-muted">Points to:</span>
          {tags.map((t) => (
            <Badge key={t.slug} tone="accent">
              {tagNames[t.slug] ?? t.slug}
            </Badge>
          ))}
        </p>
      ) : null}
    </li>
  );
}

const Row = ({ label, children }: { label: string; children: ReactNode }) => (
  <div className="flex gap-2">
    <dt className="w-40 shrink-0 text-muted">{label}</dt>
    <dd className="font-mono text-xs leading-5">{children}</dd>
  </div>
);

/** Every finding with how sure it is, the measurement behind it and the problem tags it points to. */
export function FindingCards({ findings: f, tagNames }: Props) {
  const s = f.screen;
  return (
    <ul className="space-y-3" aria-label="Findings">
      <Finding title="Backing screen" confidence={s.confidence} summary={s.summary} tags={s.tags} tagNames={tagNames}>
        {s.present && s.meanLinear ? (
          <dl className="space-y-0.5">
            <Row label="Hue (linear HSV)">{fixed(s.hue, 1)}°</Row>
            <Row label="Mean, linear RGB">
              <span aria-hidden className="mr-1 inline-block h-3 w-3 rounded-sm border border-line align-middle" style={{ background: displayHex(s.meanLinear) }} />
              {s.meanLinear.map((v) => fixed(v, 4)).join(" · ")}
            </Row>
            <Row label="Coverage">{percent(s.coverage)}</Row>
            <Row label="Unevenness">
              {fixed(s.unevenness, 1)} % (brightest {fixed(s.range?.[0], 2)}×, darkest {fixed(s.range?.[1], 2)}× the median)
            </Row>
          </dl>
        ) : null}
      </Finding>
      <Finding title="Tracking markers" confidence={f.markers.confidence} summary={f.markers.summary} tags={f.markers.tags} tagNames={tagNames}>
        {f.markers.shades.length ? (
          <ul className="flex flex-wrap gap-3" aria-label="Marker shades">
            {f.markers.shades.map((sh) => (
              <li key={sh.index} className="flex items-center gap-1.5 text-xs">
                <span aria-hidden className="inline-block h-4 w-4 rounded-sm border border-line" style={{ background: displayHex(sh.colourLinear) }} />
                Shade {sh.index + 1}: {sh.count} marker{sh.count === 1 ? "" : "s"}, linear {sh.colourLinear.map((v) => fixed(v, 3)).join(" · ")}
              </li>
            ))}
          </ul>
        ) : null}
      </Finding>
      <Finding title="Dead, hot and stuck pixels" confidence={f.defects.confidence} summary={f.defects.summary} tags={f.defects.tags} tagNames={tagNames}>
        {f.defects.items.length ? (
          <p className="font-mono text-xs">
            {f.defects.items.slice(0, 12).map((d) => `${d.kind} ${d.channels.join("").toUpperCase()} at ${d.x},${d.y}`).join(" · ")}
            {f.defects.items.length > 12 ? ` · and ${f.defects.items.length - 12} more` : ""}
          </p>
        ) : null}
      </Finding>
      <Finding title="Dust and hairs" confidence={f.dust.confidence} summary={f.dust.summary} tags={f.dust.tags} tagNames={tagNames} />
      <Finding title="Noise" confidence={f.noise.confidence} summary={f.noise.summary} tags={f.noise.tags} tagNames={tagNames}>
        <p className="text-xs text-muted">
          Single-frame estimate after J. Immerkær, “Fast Noise Variance Estimation” (1996), ± {percent(f.noise.relativeError[0], 2)} standard error.
        </p>
      </Finding>
      <Finding title="File coding" confidence={f.compression.confidence} summary={f.compression.summary} tags={f.compression.tags} tagNames={tagNames} />
      <Finding title="Clipped and crushed" confidence={f.clipping.confidence} summary={f.clipping.summary} tags={f.clipping.tags} tagNames={tagNames}>
        <dl className="space-y-0.5">
          <Row label="Clipped R · G · B">{f.clipping.clipped.join(" · ")} px</Row>
          <Row label="Crushed R · G · B">{f.clipping.crushed.join(" · ")} px</Row>
        </dl>
      </Finding>
    </ul>
  );
}
