"use client";

import { QueryClient, QueryClientProvider } from "@tanstack/react-query";
import { useEffect, useState, type ReactNode } from "react";
import { ApiError } from "@/lib/api/fetcher";

export function Providers({ children }: { children: ReactNode }) {
  // One client per browser tab; staleTime > 0 so navigating back does not refetch at once.
  const [client] = useState(
    () =>
      new QueryClient({
        defaultOptions: {
          queries: {
            staleTime: 30_000,
            retry: (count, error) => !(error instanceof ApiError && error.status < 500) && count < 2,
          },
        },
      }),
  );
  // Marks the page as interactive: browser tests wait for it before clicking a form whose submit
  // handler exists only once React has hydrated (a click before that would reload the page).
  useEffect(() => {
    document.documentElement.dataset.hydrated = "true";
  }, []);
  return <QueryClientProvider client={client}>{children}</QueryClientProvider>;
}
