/** Query keys shared by more than one component, so invalidation after a mutation hits every reader. */
export const queryKeys = {
  people: ["people"] as const,
  tokens: ["tokens"] as const,
  search: (q: string, filters?: Record<string, unknown>) => ["search", q, filters ?? {}] as const,
  subscriptions: ["subscriptions"] as const,
};
