"use client";

import dynamic from "next/dynamic";
import { Card, CardTitle } from "@/components/ui/card";
import { Skeleton } from "@/components/ui/skeleton";

/*
 * The questions are fetched in the browser (TanStack Query), so the server could only ever render
 * their loading state; it now renders that placeholder itself rather than the section's queries,
 * mutations and form (issue 19: less server work per page view, same first paint).
 */
function QuestionsPlaceholder() {
  return (
    <Card aria-labelledby="questions-title">
      <CardTitle>
        <span id="questions-title">Questions</span>
      </CardTitle>
      <Skeleton className="h-16" />
    </Card>
  );
}

export const QuestionsSectionLoader = dynamic(() => import("@/components/techniques/questions-section").then((m) => m.QuestionsSection), {
  ssr: false,
  loading: QuestionsPlaceholder,
});
