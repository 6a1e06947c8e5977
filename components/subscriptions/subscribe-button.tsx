"use client";

import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { Button } from "@/components/ui/button";
import { apiFetch } from "@/lib/api/fetcher";
import type { SubscriptionResponse } from "@/lib/subscriptions/schemas";

type Target = { kind: "technique" | "tag" | "show"; key: string };

/** One button with a clear state: follow a technique, tag or show, or stop following it. */
export function SubscribeButton({ target }: { target: Target }) {
  const client = useQueryClient();
  const key = ["subscription", target.kind, target.key];
  const current = useQuery({
    queryKey: key,
    queryFn: () => apiFetch<{ subscription: SubscriptionResponse | null }>(`/api/subscriptions?kind=${target.kind}&key=${encodeURIComponent(target.key)}`),
  });
  const toggle = useMutation({
    mutationFn: (on: boolean) => apiFetch("/api/subscriptions", { method: on ? "POST" : "DELETE", json: { target } }),
    onSettled: () => {
      void client.invalidateQueries({ queryKey: key });
      void client.invalidateQueries({ queryKey: ["subscriptions"] });
    },
  });
  const isOn = Boolean(current.data?.subscription);
  return (
    <Button
      variant={isOn ? "secondary" : "primary"}
      aria-pressed={isOn}
      disabled={current.isLoading || toggle.isPending}
      onClick={() => toggle.mutate(!isOn)}
      title={isOn ? "You get mail when this changes" : "Get mail when this changes"}
      data-testid="subscribe-button"
    >
      {current.isLoading ? "…" : isOn ? "Following ✓" : "Follow"}
    </Button>
  );
}
