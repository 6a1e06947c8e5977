// Stands in for the `server-only` guard package under vitest, where there is no client bundle to protect.
export {};
