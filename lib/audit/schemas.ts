import { z } from "zod";
import { AUDIT_ACTIONS } from "@/lib/audit/describe";

const day = z
  .string()
  .regex(/^\d{4}-\d{2}-\d{2}$/, "Give a date as YYYY-MM-DD.")
  .refine((v) => !Number.isNaN(Date.parse(`${v}T00:00:00Z`)), "Not a date.");

/** Filters of the audit log page and GET /api/admin/audit; empty form fields mean "any". */
export const auditFilterSchema = z.object({
  person: z.preprocess((v) => (v === "" ? undefined : v), z.string().uuid("Choose a person from the list.").optional()),
  action: z.preprocess((v) => (v === "" ? undefined : v), z.enum(Object.keys(AUDIT_ACTIONS) as [string, ...string[]], { error: "Choose an action from the list." }).optional()),
  from: z.preprocess((v) => (v === "" ? undefined : v), day.optional()),
  to: z.preprocess((v) => (v === "" ? undefined : v), day.optional()),
});
export type AuditFilterInput = z.infer<typeof auditFilterSchema>;
