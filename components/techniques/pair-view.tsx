import type { StillPairResponse } from "@/lib/stills/schemas";

/** A before/after pair side by side on the neutral grey surround. */
export function PairView({ pair }: { pair: StillPairResponse }) {
  return (
    <figure className="space-y-2">
      <div className="grid gap-2 bg-stage p-2 sm:grid-cols-2">
        {[pair.before, pair.after].map((s, i) => (
          // eslint-disable-next-line @next/next/no-img-element -- private, permission-checked still; next/image would cache it
          <img key={s.id} src={`/api/stills/${s.id}/preview`} alt={s.alt} className="w-full" title={i === 0 ? "Before" : "After"} />
        ))}
      </div>
      <figcaption className="text-sm">{pair.caption || `${pair.before.caption} → ${pair.after.caption}`}</figcaption>
    </figure>
  );
}
