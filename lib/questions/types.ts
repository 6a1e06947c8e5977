import type { TechniqueDocument } from "@/lib/techniques/document";

export type AnswerResponse = { id: string; author: { id: string; name: string } | null; body: TechniqueDocument; createdAt: string };
export type QuestionResponse = AnswerResponse & { resolvedAt: string | null; answers: AnswerResponse[]; canAnswer: boolean; canResolve: boolean };
