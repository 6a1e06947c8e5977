import { AppError } from "@/lib/api/errors";
import { publicRoute } from "@/lib/api/handler";

// Unknown API paths answer in the API's error shape, never with the HTML 404 page, whatever the method.
const notFound = publicRoute(async () => {
  throw new AppError("not_found", "No such API endpoint.");
});

export const GET = notFound;
export const HEAD = notFound;
export const OPTIONS = notFound;
export const POST = notFound;
export const PUT = notFound;
export const PATCH = notFound;
export const DELETE = notFound;
