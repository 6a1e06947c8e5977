import { z } from "zod";
import { ROLES } from "@/lib/auth/roles";

export const emailSchema = z
  .string()
  .trim()
  .toLowerCase()
  .max(254)
  .pipe(z.email({ message: "Enter a valid e-mail address." }));

export const credentialsSchema = z.object({
  email: emailSchema,
  password: z.string().min(1).max(512),
});

export const roleSchema = z.enum(ROLES);

export const passwordSchema = z
  .string()
  .min(10, "Use at least 10 characters.")
  .max(256, "Use at most 256 characters.");
