import Link from "next/link";
import { HouseMethodPicker } from "@/components/techniques/house-method-picker";
import { RetireDialog } from "@/components/techniques/retire-dialog";
import { ReviewActions } from "@/components/techniques/review-actions";
import { SubmitForReviewButton } from "@/components/techniques/submit-button";
import { buttonClasses } from "@/components/ui/button";
import { can } from "@/lib/auth/permissions";
import type { SessionUser } from "@/lib/auth/roles";
import { departmentMethodsForPage } from "@/lib/techniques/page-data";
import type { TechniqueResponse } from "@/lib/techniques/schemas";

/** The controls this person's role allows; the server checks every one of them again. */
export async function TechniqueActions({ user, t }: { user: SessionUser; t: TechniqueResponse }) {
  const canMark = can(user, "technique:set-house-method") && t.status === "approved";
  const problemTags = t.tags.filter((x) => x.kind === "problem");
  const current = canMark ? await departmentMethodsForPage(problemTags.map((x) => x.slug)) : {};
  const isLatest = t.revision.number === t.latestRevision;
  const state = t.revision.state;
  const retired = t.status === "retired";
  return (
    <div className="flex flex-wrap items-center gap-2">
      {can(user, "technique:write") && !retired ? (
        <Link href={`/techniques/${t.slug}/edit`} className={buttonClasses("secondary")}>
          Edit
        </Link>
      ) : null}
      {can(user, "technique:submit") && isLatest && (state === "draft" || state === "returned") && !retired ? <SubmitForReviewButton slug={t.slug} /> : null}
      {can(user, "technique:review") && isLatest && state === "in_review" ? (
        <>
          <ReviewActions slug={t.slug} revision={t.revision.number} />
          <Link href={`/techniques/${t.slug}/review`} className="text-sm text-accent underline underline-offset-2">
            Review the changes
          </Link>
        </>
      ) : null}
      {canMark ? <HouseMethodPicker slug={t.slug} title={t.title} problemTags={problemTags} current={current} /> : null}
      {can(user, "technique:retire") && !retired && t.approvedRevision !== null ? <RetireDialog slug={t.slug} /> : null}
    </div>
  );
}
