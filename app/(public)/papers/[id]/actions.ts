"use server";

import { publicAction } from "@/lib/auth/guard";
import { sendCorrection } from "@/lib/curation/corrections";
import { correctionSchema } from "@/lib/validation/curation";

/** "Send a correction" (DESIGN §9): anyone, rate-limited; stored, and curators are e-mailed. */
export const sendPaperCorrection = publicAction(correctionSchema, async (input, context) => {
  // a filled hidden field means a program filled the form: answer as if sent, store nothing
  if (input.website) return "Thank you. Your correction has been sent to the curators.";
  await sendCorrection({ paperId: input.paperId, name: input.name, email: input.email, message: input.message, address: context.address });
  return "Thank you. Your correction has been sent to the curators, who will check the entry against the paper.";
});
