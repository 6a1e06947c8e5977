"use client";

import { useOptimistic } from "react";
import { useSearchNav } from "@/components/search/search-nav";
import type { SearchFacetTag, SearchStatus } from "@/lib/search/types";
import { searchHref, toggled, type SearchApiResponse, type SearchState } from "@/lib/search-ui/params";
import { STATUS_LABELS } from "@/lib/techniques/schemas";

type Option = { value: string; label: string; count: number };

/** Facets for problem tags, plate tags and status; each box changes the address, so a filtered search can be shared. */
export function FacetPanel({ state: current, facets, tagInfo }: { state: SearchState; facets: SearchApiResponse["facets"]; tagInfo: Record<string, { name: string; kind: "problem" | "plate" }> }) {
  const { navigate } = useSearchNav();
  // Boxes tick at once; the server's answer replaces this state when the new page arrives.
  const [state, setState] = useOptimistic(current);
  const go = (next: Partial<SearchState>) => {
    const target = { ...state, ...next, offset: 0 };
    navigate(searchHref(target), () => setState(target));
  };
  const tagOptions = (list: SearchFacetTag[], kind: "problem" | "plate"): Option[] => {
    const options: Option[] = list.map((f) => ({ value: f.slug, label: f.name, count: f.count }));
    // A chosen tag stays listed (to untick it) even when nothing left carries it.
    for (const slug of state.tag) {
      const info = tagInfo[slug];
      if ((info?.kind ?? "problem") === kind && !options.some((o) => o.value === slug)) options.push({ value: slug, label: info?.name ?? slug, count: 0 });
    }
    return options;
  };
  const statusOptions: Option[] = facets.status.map((s) => ({ value: s.status, label: STATUS_LABELS[s.status], count: s.count }));
  for (const st of state.status) if (!statusOptions.some((o) => o.value === st)) statusOptions.push({ value: st, label: STATUS_LABELS[st], count: 0 });
  return (
    <div className="space-y-5 text-sm">
      <FacetGroup id="facet-problem" title="Problem" options={tagOptions(facets.problem, "problem")} chosen={state.tag} onToggle={(v) => go({ tag: toggled(state.tag, v) })} />
      <FacetGroup id="facet-plate" title="Plate" options={tagOptions(facets.plate, "plate")} chosen={state.tag} onToggle={(v) => go({ tag: toggled(state.tag, v) })} />
      <FacetGroup
        id="facet-status"
        title="Status"
        options={statusOptions}
        chosen={state.status}
        onToggle={(v) => go({ status: toggled(state.status, v as SearchStatus) })}
      />
      <label className="flex items-center gap-2">
        <input type="checkbox" checked={state.retired} onChange={() => go({ retired: !state.retired })} className="accent-[var(--color-accent)]" />
        Include retired techniques
      </label>
    </div>
  );
}

function FacetGroup({ id, title, options, chosen, onToggle }: { id: string; title: string; options: Option[]; chosen: readonly string[]; onToggle(value: string): void }) {
  if (!options.length) return null;
  return (
    <fieldset aria-labelledby={`${id}-title`}>
      <legend id={`${id}-title`} className="mb-1.5 text-xs font-semibold tracking-wide text-muted uppercase">
        {title}
      </legend>
      <ul className="space-y-1">
        {options.map((o) => (
          <li key={o.value}>
            <label className="flex cursor-pointer items-center gap-2 rounded px-1 py-0.5 hover:bg-surface-2">
              <input type="checkbox" checked={chosen.includes(o.value)} onChange={() => onToggle(o.value)} className="accent-[var(--color-accent)]" />
              <span className="flex-1">{o.label}</span>
              <span className="text-xs text-muted tabular-nums">{o.count}</span>
            </label>
          </li>
        ))}
      </ul>
    </fieldset>
  );
}
