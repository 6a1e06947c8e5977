/** A use's still as a small thumbnail that opens the larger preview; both are permission-checked API routes. */
export function StillThumb({ id, alt, label }: { id: string; alt: string | null; label: string }) {
  const text = alt?.trim() || `${label} still`;
  return (
    <figure className="w-32">
      <a href={`/api/stills/${id}/preview`} target="_blank" rel="noopener" className="block rounded border border-line hover:border-accent" title={`Open the ${label.toLowerCase()} still`}>
        {/* eslint-disable-next-line @next/next/no-img-element -- private, permission-checked still; next/image would cache it */}
        <img src={`/api/stills/${id}/thumb`} alt={text} loading="lazy" className="h-20 w-full rounded object-cover" />
      </a>
      <figcaption className="mt-0.5 flex justify-between text-xs text-muted">
        {label}
        <a href={`/stills/${id}`} className="hover:text-accent" title={`Plate check of the ${label.toLowerCase()} still`}>
          Check
        </a>
      </figcaption>
    </figure>
  );
}
