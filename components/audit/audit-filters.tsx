import Link from "next/link";
import { buttonClasses } from "@/components/ui/button";
import { inputClasses } from "@/components/ui/field";
import { auditActionGroups } from "@/lib/audit/describe";
import type { AuditFilterInput } from "@/lib/audit/schemas";

/** The audit log's filters: a plain GET form, so every filtered page has its own address. */
export function AuditFilters({ people, value }: { people: { id: string; name: string }[]; value: AuditFilterInput }) {
  return (
    <form method="get" className="flex flex-wrap items-end gap-3 text-sm" aria-label="Filter the audit log">
      <label className="space-y-1">
        <span className="block text-muted">Person</span>
        <select name="person" defaultValue={value.person ?? ""} className={inputClasses}>
          <option value="">Anyone</option>
          {people.map((p) => (
            <option key={p.id} value={p.id}>
              {p.name}
            </option>
          ))}
        </select>
      </label>
      <label className="space-y-1">
        <span className="block text-muted">Action</span>
        <select name="action" defaultValue={value.action ?? ""} className={inputClasses}>
          <option value="">Any action</option>
          {auditActionGroups().map((g) => (
            <optgroup key={g.area} label={g.area}>
              {g.actions.map((a) => (
                <option key={a.action} value={a.action}>
                  {a.label}
                </option>
              ))}
            </optgroup>
          ))}
        </select>
      </label>
      <label className="space-y-1">
        <span className="block text-muted">From (UTC day)</span>
        <input type="date" name="from" defaultValue={value.from ?? ""} className={inputClasses} />
      </label>
      <label className="space-y-1">
        <span className="block text-muted">To (UTC day)</span>
        <input type="date" name="to" defaultValue={value.to ?? ""} className={inputClasses} />
      </label>
      <button className={buttonClasses("primary")}>Show</button>
      <Link href="/audit" className="py-1.5 text-muted hover:text-ink">
        Clear filters
      </Link>
    </form>
  );
}
