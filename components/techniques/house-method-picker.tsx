"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { Select } from "@/components/ui/field";
import { ApiError, apiFetch } from "@/lib/api/fetcher";
import type { TagRef } from "@/lib/techniques/schemas";

/** A lead marks this approved technique as the department's method for one of its problem tags. */
export function HouseMethodPicker({ slug, problemTags, currentFor }: { slug: string; problemTags: TagRef[]; currentFor: string[] }) {
  const router = useRouter();
  const choices = problemTags.filter((t) => !currentFor.includes(t.slug));
  const [tag, setTag] = useState(choices[0]?.slug ?? "");
  const [message, setMessage] = useState<string | null>(null);
  if (!choices.length) return null;
  return (
    <div className="flex items-center gap-2">
      <label htmlFor="house-tag" className="text-sm text-muted">
        Department method for
      </label>
      <Select id="house-tag" className="w-auto" value={tag} onChange={(e) => setTag(e.target.value)}>
        {choices.map((t) => (
          <option key={t.slug} value={t.slug}>
            {t.name}
          </option>
        ))}
      </Select>
      <Button
        onClick={async () => {
          try {
            await apiFetch(`/api/tags/${tag}/house-method`, { method: "PUT", json: { technique: slug } });
            router.refresh();
          } catch (e) {
            setMessage(e instanceof ApiError ? e.message : "That did not work.");
          }
        }}
      >
        Mark
      </Button>
      {message ? <span role="alert" className="text-sm text-bad">{message}</span> : null}
    </div>
  );
}
