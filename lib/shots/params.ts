/**
 * A dynamic route segment as text. Segments may arrive still percent-encoded; a malformed escape
 * (a stray "%") is kept as typed so the page answers "not found" rather than failing.
 */
export function paramValue(segment: string): string {
  try {
    return decodeURIComponent(segment);
  } catch {
    return segment;
  }
}
