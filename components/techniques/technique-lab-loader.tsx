"use client";

import dynamic from "next/dynamic";
import { Skeleton } from "@/components/ui/skeleton";

/*
 * The still lab is an interactive tool that does nothing until scripts run, and it was the
 * largest part of a technique page's server render (about half the markup). It is rendered in
 * the browser only; the page's server render keeps a placeholder of about its height.
 */
function LabPlaceholder() {
  return (
    <div role="status" aria-label="Loading the still lab" className="rounded-lg border border-line bg-surface p-4">
      <Skeleton className="h-[28rem] w-full" />
    </div>
  );
}

export const TechniqueLabLoader = dynamic(() => import("@/components/lab/technique-lab").then((m) => m.TechniqueLab), { ssr: false, loading: LabPlaceholder });
export const TechniqueLabWithApplyLoader = dynamic(() => import("@/components/lab/technique-lab-apply").then((m) => m.TechniqueLabWithApply), {
  ssr: false,
  loading: LabPlaceholder,
});
