import type { Metadata } from "next";
import { redirect } from "next/navigation";
import { Card } from "@/components/ui/card";
import { RevisionFacts } from "@/components/techniques/revision-facts";
import { QuestionsSectionLoader } from "@/components/techniques/questions-section-loader";
import { PageContents } from "@/components/techniques/page-contents";
import { RenderedBody } from "@/components/techniques/rendered-body";
import { TechniqueActions } from "@/components/techniques/technique-actions";
import { TechniqueBanners } from "@/components/techniques/technique-banners";
import { TechniqueHeader } from "@/components/techniques/technique-header";
import { TechniqueEvidence } from "@/components/techniques/technique-evidence";
import { TechniqueShots } from "@/components/techniques/technique-shots";
import { TechniqueLabSection } from "@/components/techniques/technique-lab-section";
import { SubscribeButton } from "@/components/subscriptions/subscribe-button";
import { loadOrNotFound } from "@/lib/api/page-guards";
import { requireUser } from "@/lib/auth/session";
import { techniqueForPage } from "@/lib/techniques/page-data";
import { CONTENTS_MIN_HEADINGS } from "@/lib/techniques/outline";
import { renderDocument } from "@/lib/techniques/render";

type Props = { params: Promise<{ slug: string }> };

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  return { title: (await params).slug.replace(/-/g, " ") };
}

export default async function TechniquePage({ params }: Props) {
  const user = await requireUser();
  const { slug } = await params;
  const t = await loadOrNotFound(() => techniqueForPage(user, slug));
  if (t.renamedFrom) redirect(`/techniques/${t.slug}`);
  const body = renderDocument(t.body);
  return (
    <article className="space-y-6">
      <TechniqueHeader t={t} />
      <TechniqueBanners t={t} />
      <div className="flex flex-wrap items-center gap-2">
        <TechniqueActions user={user} t={t} />
        <div className="ml-auto">
          <SubscribeButton target={{ kind: "technique", key: t.slug }} />
        </div>
      </div>
      <div className="grid gap-6 lg:grid-cols-[minmax(0,1fr)_18rem]">
        <div className="space-y-6">
          <Card>
            <RenderedBody doc={t.body} html={body.html} />
          </Card>
        </div>
        <aside className="space-y-4" aria-label="About this technique">
          <RevisionFacts shown={t.revision.number} approved={t.approvedRevision} newest={t.latestRevision} changeNote={t.revision.changeNote || null} />
          {body.outline.length >= CONTENTS_MIN_HEADINGS ? (
            <Card className="lg:sticky lg:top-4">
              <PageContents outline={body.outline} />
            </Card>
          ) : null}
        </aside>
      </div>
      {/* The compare view takes the page's full width: stills need the room more than the sidebar. */}
      <TechniqueEvidence user={user} technique={t} />
      <div className="space-y-6">
        <TechniqueLabSection user={user} technique={t} />
        <TechniqueShots user={user} technique={t} />
        <QuestionsSectionLoader slug={t.slug} canAsk />
      </div>
    </article>
  );
}
