import { AppError } from "@/lib/api/errors";
import { errorResponse } from "@/lib/api/handler";

// Unknown API paths answer in the API's error shape, never with the HTML 404 page.
function notFound(): Response {
  return errorResponse(new AppError("not_found", "No such API endpoint."));
}

export const GET = notFound;
export const POST = notFound;
export const PUT = notFound;
export const PATCH = notFound;
export const DELETE = notFound;
