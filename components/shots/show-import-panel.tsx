"use client";

import { useQueryClient } from "@tanstack/react-query";
import { useRouter } from "next/navigation";
import { ShotImport } from "@/components/shots/shot-import";
import { showShotsKey } from "@/components/shots/show-shots-table";

/** The lead's import on a show page: once committed, the shot table and the shot count are fetched again. */
export function ShowImportPanel({ showCode }: { showCode: string }) {
  const client = useQueryClient();
  const router = useRouter();
  return (
    <ShotImport
      showCode={showCode}
      onImported={(result) => {
        if (result.created + result.updated === 0) return;
        void client.invalidateQueries({ queryKey: showShotsKey(showCode) });
        router.refresh();
      }}
    />
  );
}
