import "server-only";
import { notFound } from "next/navigation";
import { isAppError } from "@/lib/api/errors";

/** Runs a DAL read for a page; "not found" (which also hides what a person may not see) becomes the 404 page. */
export async function loadOrNotFound<T>(load: () => Promise<T>): Promise<T> {
  try {
    return await load();
  } catch (error) {
    if (isAppError(error) && error.code === "not_found") notFound();
    throw error;
  }
}
