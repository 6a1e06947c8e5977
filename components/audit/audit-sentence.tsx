import Link from "next/link";
import type { SentencePart } from "@/lib/audit/describe";

/** One audit entry read as a sentence; names link to what they name. */
export function AuditSentence({ parts }: { parts: SentencePart[] }) {
  return (
    <>
      {parts.map((part, i) =>
        typeof part === "string" ? (
          part
        ) : part.href ? (
          <Link key={i} href={part.href} className="font-medium text-accent underline-offset-2 hover:underline">
            {part.text}
          </Link>
        ) : (
          <strong key={i} className="font-medium">
            {part.text}
          </strong>
        ),
      )}
    </>
  );
}
