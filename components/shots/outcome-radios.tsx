import { USE_OUTCOME_LABELS, USE_OUTCOMES, type UseOutcome } from "@/lib/uses/schemas";

/** The three outcomes of a use log as one radio group. */
export function OutcomeRadios({ name, value, onChange }: { name: string; value: UseOutcome; onChange(outcome: UseOutcome): void }) {
  return (
    <fieldset>
      <legend className="mb-1 text-sm font-medium">How did it go?</legend>
      <div className="flex flex-wrap gap-3 text-sm">
        {USE_OUTCOMES.map((o) => (
          <label key={o} className="flex items-center gap-1.5">
            <input type="radio" name={name} value={o} checked={value === o} onChange={() => onChange(o)} />
            {USE_OUTCOME_LABELS[o]}
          </label>
        ))}
      </div>
    </fieldset>
  );
}
