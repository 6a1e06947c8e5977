/** Marks the proxy's own render request: it must render, not be answered from the cache. */
export const RENDER_HEADER = "x-plateroom-render";
/** Says how a page was answered ("hit" or "rendered"), for tests, benchmarks and people reading logs. */
export const CACHE_STATUS_HEADER = "x-plateroom-page-cache";
