"use server";

import { AuthError } from "next-auth";
import { headers } from "next/headers";
import { redirect } from "next/navigation";
import { auth, signIn, signOut } from "@/lib/auth";
import { clientAddress } from "@/lib/auth/client-address";
import { credentialsSchema, emailSchema } from "@/lib/auth/schemas";
import { signInWait, signInWaitMessage, waitInWords } from "@/lib/people/sign-in";
import { setPasswordWithToken } from "@/lib/people/mutations";
import { afterAnswer, requestPasswordReset, resetAnswerMessage } from "@/lib/people/password-reset";
import { setPasswordSchema } from "@/lib/people/schemas";
import { zodFields, isAppError } from "@/lib/api/errors";
import { endAllSessions } from "@/lib/people/sign-in";
import { GENERIC_SIGN_IN_FAILURE } from "@/lib/auth/messages";

export type FormState = { message?: string; fieldErrors?: Record<string, string>; ok?: boolean };


export async function signInAction(_prev: FormState, form: FormData): Promise<FormState> {
  const parsed = credentialsSchema.safeParse({ email: form.get("email"), password: form.get("password") });
  if (!parsed.success) return { message: GENERIC_SIGN_IN_FAILURE };
  const wait = await signInWait(parsed.data.email, clientAddress(await headers()));
  if (wait) return { message: signInWaitMessage(wait) };
  const next = String(form.get("next") ?? "/");
  // Only same-site paths: an open redirect after sign-in would help phishing.
  const redirectTo = next.startsWith("/") && !next.startsWith("//") ? next : "/";
  try {
    await signIn("credentials", { email: parsed.data.email, password: parsed.data.password, redirectTo });
  } catch (error) {
    if (error instanceof AuthError) return { message: GENERIC_SIGN_IN_FAILURE };
    throw error;
  }
  return {};
}

export async function signOutAction(): Promise<void> {
  const session = await auth();
  if (session?.user?.id) await endAllSessions(session.user.id);
  await signOut({ redirectTo: "/login" });
}

export async function setPasswordAction(_prev: FormState, form: FormData): Promise<FormState> {
  const parsed = setPasswordSchema.safeParse({ token: form.get("token"), password: form.get("password"), confirm: form.get("confirm") });
  if (!parsed.success) return { fieldErrors: zodFields(parsed.error) };
  try {
    await setPasswordWithToken(parsed.data.token, parsed.data.password);
  } catch (error) {
    if (isAppError(error)) return { message: error.message };
    throw error;
  }
  redirect("/login?password=set");
}

export async function forgotPasswordAction(_prev: FormState, form: FormData): Promise<FormState> {
  const parsed = emailSchema.safeParse(form.get("email"));
  if (!parsed.success) return { fieldErrors: { email: "Enter a valid e-mail address." } };
  const answer = await requestPasswordReset(parsed.data, clientAddress(await headers()), afterAnswer);
  return { ok: answer.ok, message: resetAnswerMessage(answer, waitInWords) };
}
