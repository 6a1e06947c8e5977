import { z } from "zod";
import { techniqueDocumentSchema, type TechniqueDocument } from "@/lib/techniques/document";

type AnswerResponse = { id: string; author: { id: string; name: string } | null; body: TechniqueDocument; createdAt: string };
export type QuestionResponse = AnswerResponse & { resolvedAt: string | null; answers: AnswerResponse[]; canAnswer: boolean; canResolve: boolean };

export const questionSchema = z.object({ body: techniqueDocumentSchema });
export const answerSchema = z.object({ body: techniqueDocumentSchema });
