import { z } from "zod";
import { emailSchema, passwordSchema, roleSchema } from "@/lib/auth/schemas";
import type { Role } from "@/lib/auth/roles";

const personNameSchema = z.string().trim().min(1, "Enter a name.").max(120);

export const invitePersonSchema = z.object({
  email: emailSchema,
  name: personNameSchema,
  role: roleSchema,
});
export type InvitePersonInput = z.infer<typeof invitePersonSchema>;

export const updatePersonSchema = z
  .object({ role: roleSchema.optional(), disabled: z.boolean().optional() })
  .refine((v) => v.role !== undefined || v.disabled !== undefined, { message: "Nothing to change." });
export type UpdatePersonInput = z.infer<typeof updatePersonSchema>;

export const createTokenSchema = z.object({ name: z.string().trim().min(1, "Name the token.").max(80) });

export const setPasswordSchema = z
  .object({ token: z.string().min(10).max(200), password: passwordSchema, confirm: z.string() })
  .refine((v) => v.password === v.confirm, { message: "The passwords do not match.", path: ["confirm"] });

export type PersonResponse = {
  id: string;
  email: string;
  name: string;
  role: Role;
  disabled: boolean;
  hasPassword: boolean;
  createdAt: string;
};
export type PeopleResponse = { items: PersonResponse[] };
export type InviteResponse = { person: PersonResponse; setPasswordUrl: string };
export type TokenResponse = { id: string; name: string; createdAt: string; lastUsedAt: string | null };
export type CreatedTokenResponse = { id: string; token: string };
export type MeResponse = { id: string; email: string; name: string; role: Role };
