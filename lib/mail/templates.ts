/**
 * One source for every message: a small structured model rendered twice, to HTML and to
 * plain text, so the two parts can never say different things. Pure (no server imports),
 * so the admin mail view and unit tests can use it too.
 */

type MailBlock =
  | { type: "paragraph"; text: string }
  /** A quoted passage written by a person, e.g. a change note. */
  | { type: "quote"; label?: string; text: string }
  /** The main call to action. */
  | { type: "button"; label: string; href: string }
  | { type: "link"; label: string; href: string }
  | { type: "items"; items: { title: string; href: string; summary?: string; meta?: string }[] }
  | { type: "note"; text: string };

export type MailContent = {
  subject: string;
  /** First line of the body, e.g. "Hello Ada,". */
  greeting?: string;
  heading: string;
  blocks: MailBlock[];
  /** Why the person gets this mail ("You follow the tag …"). */
  reason?: string;
  unsubscribeUrl?: string;
};

type RenderedMail = { subject: string; html: string; text: string };

const HTML_ESCAPES: Record<string, string> = { "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" };

export function escapeHtml(value: string): string {
  return value.replace(/[&<>"']/g, (c) => HTML_ESCAPES[c] ?? c);
}

/** Only http(s) links go into href; anything else (javascript:, data:) is dropped to a harmless "#". */
export function safeHref(href: string): string {
  try {
    const url = new URL(href);
    return url.protocol === "http:" || url.protocol === "https:" ? url.toString() : "#";
  } catch {
    return "#";
  }
}

/** Subjects are one header line: collapse newlines so a title cannot inject headers. */
export function cleanSubject(subject: string): string {
  return subject.replace(/[\r\n\t]+/g, " ").replace(/\s{2,}/g, " ").trim().slice(0, 250);
}

// Neutral, inline styles: many mail readers drop <style> blocks.
const S = {
  body: "margin:0;padding:0;background:#f4f4f5;",
  wrap: "max-width:600px;margin:0 auto;padding:24px 16px;font-family:-apple-system,Segoe UI,Helvetica,Arial,sans-serif;color:#18181b;font-size:15px;line-height:1.5;",
  card: "background:#ffffff;border:1px solid #e4e4e7;border-radius:8px;padding:24px;",
  h1: "margin:0 0 16px;font-size:19px;font-weight:600;",
  p: "margin:0 0 14px;",
  quote: "margin:0 0 14px;padding:8px 12px;border-left:3px solid #a1a1aa;background:#fafafa;white-space:pre-wrap;",
  label: "margin:0 0 4px;font-size:13px;color:#52525b;",
  button: "display:inline-block;padding:9px 16px;background:#27272a;color:#ffffff;text-decoration:none;border-radius:6px;font-weight:600;",
  link: "color:#1d4ed8;",
  note: "margin:0 0 14px;font-size:13px;color:#52525b;",
  item: "margin:0 0 12px;",
  footer: "margin:16px 0 0;font-size:12px;color:#71717a;",
};

function renderBlockHtml(block: MailBlock): string {
  switch (block.type) {
    case "paragraph":
      return `<p style="${S.p}">${escapeHtml(block.text)}</p>`;
    case "quote":
      return (
        (block.label ? `<p style="${S.label}">${escapeHtml(block.label)}</p>` : "") +
        `<blockquote style="${S.quote}">${escapeHtml(block.text)}</blockquote>`
      );
    case "button":
      return `<p style="${S.p}"><a href="${escapeHtml(safeHref(block.href))}" style="${S.button}">${escapeHtml(block.label)}</a></p>`;
    case "link":
      return `<p style="${S.p}"><a href="${escapeHtml(safeHref(block.href))}" style="${S.link}">${escapeHtml(block.label)}</a></p>`;
    case "items":
      return (
        `<ul style="margin:0 0 14px;padding-left:20px;">` +
        block.items
          .map(
            (item) =>
              `<li style="${S.item}"><a href="${escapeHtml(safeHref(item.href))}" style="${S.link}">${escapeHtml(item.title)}</a>` +
              (item.meta ? ` <span style="color:#71717a;font-size:13px;">${escapeHtml(item.meta)}</span>` : "") +
              (item.summary ? `<br><span style="white-space:pre-wrap;">${escapeHtml(item.summary)}</span>` : "") +
              `</li>`,
          )
          .join("") +
        `</ul>`
      );
    case "note":
      return `<p style="${S.note}">${escapeHtml(block.text)}</p>`;
  }
}

function renderBlockText(block: MailBlock): string {
  switch (block.type) {
    case "paragraph":
    case "note":
      return block.text;
    case "quote":
      return (block.label ? `${block.label}\n` : "") + block.text.split("\n").map((line) => `> ${line}`).join("\n");
    case "button":
    case "link":
      return `${block.label}: ${block.href}`;
    case "items":
      return block.items
        .map((item) => {
          const head = `- ${item.title}${item.meta ? ` (${item.meta})` : ""}`;
          const summary = item.summary ? `\n  ${item.summary.replace(/\n/g, "\n  ")}` : "";
          return `${head}${summary}\n  ${item.href}`;
        })
        .join("\n\n");
  }
}

export function renderMail(content: MailContent): RenderedMail {
  const subject = cleanSubject(content.subject);
  const footerHtml = [
    content.reason ? escapeHtml(content.reason) : "",
    content.unsubscribeUrl
      ? `<a href="${escapeHtml(safeHref(content.unsubscribeUrl))}" style="color:#71717a;">Unsubscribe</a> with one click, no sign-in needed.`
      : "",
    "Plateroom, the paint and prep knowledge base.",
  ]
    .filter(Boolean)
    .join("<br>");
  const html =
    `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width,initial-scale=1">` +
    `<title>${escapeHtml(subject)}</title></head><body style="${S.body}"><div style="${S.wrap}"><div style="${S.card}">` +
    (content.greeting ? `<p style="${S.p}">${escapeHtml(content.greeting)}</p>` : "") +
    `<h1 style="${S.h1}">${escapeHtml(content.heading)}</h1>` +
    content.blocks.map(renderBlockHtml).join("") +
    `</div><p style="${S.footer}">${footerHtml}</p></div></body></html>`;

  const footerText = [
    content.reason ?? "",
    content.unsubscribeUrl ? `Unsubscribe with one click: ${content.unsubscribeUrl}` : "",
    "Plateroom, the paint and prep knowledge base.",
  ].filter(Boolean);
  const text =
    [content.greeting ?? "", content.heading, ...content.blocks.map(renderBlockText)].filter(Boolean).join("\n\n") +
    `\n\n-- \n${footerText.join("\n")}\n`;
  return { subject, html, text };
}

// ---- The messages Plateroom sends ----

export type TechniqueRef = { slug: string; title: string };

export function inviteMail(m: { name: string; link: string; invitedBy?: string }): MailContent {
  return {
    subject: "You are invited to Plateroom",
    greeting: `Hello ${m.name},`,
    heading: "Set your password to start",
    blocks: [
      {
        type: "paragraph",
        text: m.invitedBy
          ? `${m.invitedBy} has made you an account on Plateroom, the department's knowledge base of plate cleanup techniques.`
          : "An account has been made for you on Plateroom, the department's knowledge base of plate cleanup techniques.",
      },
      { type: "button", label: "Set your password", href: m.link },
      { type: "note", text: "The link works once and expires in 7 days. If it has expired, ask an admin for a new invitation." },
    ],
  };
}

export function resetMail(m: { name: string; link: string }): MailContent {
  return {
    subject: "Reset your Plateroom password",
    greeting: `Hello ${m.name},`,
    heading: "Choose a new password",
    blocks: [
      { type: "paragraph", text: "Someone asked to reset the password of your Plateroom account. If it was you, use the link below." },
      { type: "button", label: "Choose a new password", href: m.link },
      { type: "note", text: "The link works once and expires in one hour. If you did not ask for this, ignore this message; your password stays as it is." },
    ],
  };
}

export function revisionApprovedMail(m: {
  name: string;
  technique: TechniqueRef;
  revisionNumber: number;
  changeNote: string;
  techniqueUrl: string;
  diffUrl: string | null;
  reason: string;
  unsubscribeUrl?: string;
}): MailContent {
  const blocks: MailBlock[] = [
    { type: "paragraph", text: `Revision ${m.revisionNumber} of "${m.technique.title}" has been approved and is now the method everyone sees.` },
    { type: "quote", label: "Change note", text: m.changeNote.trim() || "(no change note)" },
    { type: "button", label: "Open the technique", href: m.techniqueUrl },
  ];
  if (m.diffUrl) blocks.push({ type: "link", label: "See what changed", href: m.diffUrl });
  return {
    subject: `Updated: ${m.technique.title} (revision ${m.revisionNumber})`,
    greeting: `Hello ${m.name},`,
    heading: `${m.technique.title} has a new approved revision`,
    blocks,
    reason: m.reason,
    unsubscribeUrl: m.unsubscribeUrl,
  };
}

export function techniqueRetiredMail(m: {
  name: string;
  technique: TechniqueRef;
  supersededBy: (TechniqueRef & { url: string }) | null;
  note: string | null;
  techniqueUrl: string;
  reason: string;
  unsubscribeUrl?: string;
}): MailContent {
  const blocks: MailBlock[] = [
    {
      type: "paragraph",
      text: m.supersededBy
        ? `"${m.technique.title}" has been retired and replaced by "${m.supersededBy.title}".`
        : `"${m.technique.title}" has been retired and should no longer be used on new shots.`,
    },
  ];
  if (m.note?.trim()) blocks.push({ type: "quote", label: "Note", text: m.note.trim() });
  if (m.supersededBy) blocks.push({ type: "button", label: `Open ${m.supersededBy.title}`, href: m.supersededBy.url });
  blocks.push({ type: "link", label: "The retired technique", href: m.techniqueUrl });
  return {
    subject: m.supersededBy ? `Replaced: ${m.technique.title} → ${m.supersededBy.title}` : `Retired: ${m.technique.title}`,
    greeting: `Hello ${m.name},`,
    heading: m.supersededBy ? `${m.technique.title} is replaced` : `${m.technique.title} is retired`,
    blocks,
    reason: m.reason,
    unsubscribeUrl: m.unsubscribeUrl,
  };
}

export function newUnderTagMail(m: {
  name: string;
  technique: TechniqueRef & { summary?: string };
  tagName: string;
  techniqueUrl: string;
  reason: string;
  unsubscribeUrl?: string;
}): MailContent {
  const blocks: MailBlock[] = [{ type: "paragraph", text: `A new technique has been approved under "${m.tagName}".` }];
  if (m.technique.summary?.trim()) blocks.push({ type: "quote", label: "Summary", text: m.technique.summary.trim() });
  blocks.push({ type: "button", label: "Open the technique", href: m.techniqueUrl });
  return {
    subject: `New under ${m.tagName}: ${m.technique.title}`,
    greeting: `Hello ${m.name},`,
    heading: `New technique: ${m.technique.title}`,
    blocks,
    reason: m.reason,
    unsubscribeUrl: m.unsubscribeUrl,
  };
}

export function personalMail(m: { name: string; kind: "question-answered" | "request-resolved"; title: string; link: string; summary: string }): MailContent {
  const answered = m.kind === "question-answered";
  const blocks: MailBlock[] = [
    {
      type: "paragraph",
      text: answered ? `Your question on "${m.title}" has an answer.` : `Your technique request "${m.title}" has been resolved.`,
    },
  ];
  if (m.summary.trim()) blocks.push({ type: "quote", label: answered ? "Answer" : "Resolution", text: m.summary.trim() });
  blocks.push({ type: "button", label: answered ? "Read the answer" : "Open it", href: m.link });
  return {
    subject: answered ? `Answered: your question on ${m.title}` : `Resolved: ${m.title}`,
    greeting: `Hello ${m.name},`,
    heading: answered ? "Your question was answered" : "Your request was resolved",
    blocks,
    reason: answered ? "You get this because you asked the question." : "You get this because you made the request.",
  };
}

/** To the author of a revision a lead approved or sent back. */
export function revisionReviewedMail(m: {
  name: string;
  technique: TechniqueRef;
  revisionNumber: number;
  decision: "approve" | "return";
  reviewer: string;
  note: string | null;
  link: string;
}): MailContent {
  const approved = m.decision === "approve";
  const blocks: MailBlock[] = [
    {
      type: "paragraph",
      text: approved
        ? `${m.reviewer} approved your revision ${m.revisionNumber} of "${m.technique.title}". Everyone now sees it.`
        : `${m.reviewer} sent your revision ${m.revisionNumber} of "${m.technique.title}" back to you. Change what the note asks, then submit it again.`,
    },
  ];
  if (m.note?.trim()) blocks.push({ type: "quote", label: approved ? `Note from ${m.reviewer}` : `What ${m.reviewer} asks you to change`, text: m.note.trim() });
  blocks.push({ type: "button", label: approved ? "Open the technique" : "Edit the technique", href: m.link });
  return {
    subject: approved ? `Approved: ${m.technique.title} (revision ${m.revisionNumber})` : `Sent back: ${m.technique.title} (revision ${m.revisionNumber})`,
    greeting: `Hello ${m.name},`,
    heading: approved ? "Your revision was approved" : "Your revision was sent back",
    blocks,
    reason: "You get this because you wrote the revision.",
  };
}

/** To the authors of a technique when someone asks a question on it. */
export function questionAskedMail(m: { name: string; technique: TechniqueRef; asker: string; question: string; link: string }): MailContent {
  return {
    subject: `Question on ${m.technique.title}`,
    greeting: `Hello ${m.name},`,
    heading: `${m.asker} asked a question`,
    blocks: [
      { type: "paragraph", text: `${m.asker} asked a question on "${m.technique.title}".` },
      { type: "quote", label: "Question", text: m.question.trim() || "(no text)" },
      { type: "button", label: "Answer it", href: m.link },
    ],
    reason: "You get this because you wrote this technique.",
  };
}

/** To every lead when a revision is submitted for review. */
export function reviewWaitingMail(m: {
  name: string;
  technique: TechniqueRef;
  revisionNumber: number;
  author: string;
  isEdit: boolean;
  changeNote: string;
  link: string;
}): MailContent {
  const blocks: MailBlock[] = [
    {
      type: "paragraph",
      text: m.isEdit
        ? `${m.author} submitted revision ${m.revisionNumber} of the approved technique "${m.technique.title}". Readers keep the approved text until a lead approves it.`
        : `${m.author} submitted the new technique "${m.technique.title}" for review.`,
    },
  ];
  if (m.isEdit && m.changeNote.trim()) blocks.push({ type: "quote", label: "Change note", text: m.changeNote.trim() });
  blocks.push({ type: "button", label: m.isEdit ? "Review the changes" : "Review it", href: m.link });
  return {
    subject: `To review: ${m.technique.title} (revision ${m.revisionNumber})`,
    greeting: `Hello ${m.name},`,
    heading: "A revision is waiting for review",
    blocks,
    reason: "You get this because you are a lead. Choose daily mail on your settings page to get these once a day.",
  };
}

/** To followers of a problem when a lead changes its department method. */
export function departmentMethodMail(m: {
  name: string;
  problem: string;
  technique: TechniqueRef & { url: string };
  replaced: (TechniqueRef & { url: string }) | null;
  lead: string;
  reason: string;
  unsubscribeUrl?: string;
}): MailContent {
  const blocks: MailBlock[] = [
    {
      type: "paragraph",
      text: m.replaced
        ? `${m.lead} made "${m.technique.title}" the department method for ${m.problem}, in place of "${m.replaced.title}".`
        : `${m.lead} made "${m.technique.title}" the department method for ${m.problem}.`,
    },
    { type: "button", label: `Open ${m.technique.title}`, href: m.technique.url },
  ];
  if (m.replaced) blocks.push({ type: "link", label: `The former method, ${m.replaced.title}`, href: m.replaced.url });
  return {
    subject: `Department method for ${m.problem}: ${m.technique.title}`,
    greeting: `Hello ${m.name},`,
    heading: `New department method for ${m.problem}`,
    blocks,
    reason: m.reason,
    unsubscribeUrl: m.unsubscribeUrl,
  };
}

type DigestEntry = { kind: string; title: string; summary: string; link: string; createdAt: Date };

const DIGEST_SECTION_TITLES: Record<string, string> = {
  "revision-approved": "New approved revisions",
  "technique-retired": "Retired or replaced",
  "new-approved-under-tag": "New techniques under your tags",
  "question-answered": "Answers to your questions",
  "request-resolved": "Resolved requests",
  "review-waiting": "Waiting for your review",
  "revision-reviewed": "Your revisions, reviewed",
  "question-asked": "Questions on your techniques",
  "department-method": "Department methods",
};

export function digestMail(m: { name: string; day: string; entries: DigestEntry[]; settingsUrl: string; unsubscribeUrl?: string }): MailContent {
  const groups = new Map<string, DigestEntry[]>();
  for (const entry of m.entries) {
    const list = groups.get(entry.kind) ?? [];
    list.push(entry);
    groups.set(entry.kind, list);
  }
  const blocks: MailBlock[] = [
    { type: "paragraph", text: `${m.entries.length} ${m.entries.length === 1 ? "change" : "changes"} you follow, collected for ${m.day}.` },
  ];
  for (const [kind, entries] of groups) {
    blocks.push({ type: "paragraph", text: DIGEST_SECTION_TITLES[kind] ?? "Other changes" });
    blocks.push({ type: "items", items: entries.map((e) => ({ title: e.title, href: e.link, summary: e.summary || undefined })) });
  }
  blocks.push({ type: "link", label: "Change what you follow or get mail at once", href: m.settingsUrl });
  return {
    subject: `Plateroom daily digest: ${m.entries.length} ${m.entries.length === 1 ? "change" : "changes"} (${m.day})`,
    greeting: `Hello ${m.name},`,
    heading: "Your daily digest",
    blocks,
    reason: "You get this digest because you chose daily mail on your settings page.",
    unsubscribeUrl: m.unsubscribeUrl,
  };
}
