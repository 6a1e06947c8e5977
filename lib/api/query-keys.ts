/** Query keys in one place so invalidation after a mutation hits every reader. */
export const queryKeys = {
  me: ["me"] as const,
  people: ["people"] as const,
  tokens: ["tokens"] as const,
  outbox: (state?: string) => ["outbox", state ?? "all"] as const,
  techniques: (filters?: Record<string, string | undefined>) => ["techniques", filters ?? {}] as const,
  technique: (slug: string) => ["technique", slug] as const,
  uses: (slug: string) => ["uses", slug] as const,
  search: (q: string, filters?: Record<string, unknown>) => ["search", q, filters ?? {}] as const,
  subscriptions: ["subscriptions"] as const,
  shots: (q: string) => ["shots", q] as const,
};
