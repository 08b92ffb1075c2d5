"use server";

import { revalidatePath } from "next/cache";
import { redirect } from "next/navigation";
import { actionWithRole } from "@/lib/auth/guard";
import { createPaper } from "@/lib/curation/create";
import { canRead } from "@/lib/curation/rules";
import { AppError } from "@/lib/errors";
import { submitEntry } from "@/lib/curation/workflow";
import { newPaperSchema, submitEntrySchema } from "@/lib/validation/curation";

/** New paper from the form (DOI lookup, BibTeX/RIS or typed): a known DOI opens the existing paper. */
export const createPaperFromForm = actionWithRole("contributor", newPaperSchema, async (input, user) => {
  const outcome = await createPaper(input, user);
  if (!outcome.created) {
    const existing = { state: outcome.state, createdBy: outcome.createdBy };
    if (existing.state === "verified") redirect(`/papers/${outcome.existingPaperId}`);
    if (canRead(existing, user)) redirect(`/workbench/papers/${outcome.existingPaperId}?existing=1`);
    const message = "This DOI is already in the corpus: another contributor is coding the paper. A curator can tell you more.";
    throw new AppError("conflict", message, { fields: { doi: [message] } });
  }
  revalidatePath("/workbench");
  redirect(`/workbench/papers/${outcome.paperId}`);
});

export const submitForVerification = actionWithRole("contributor", submitEntrySchema, async (input, user) => {
  await submitEntry({ paperId: input.paperId, version: input.version, actor: user });
  revalidatePath("/workbench");
  revalidatePath(`/workbench/papers/${input.paperId}`);
  revalidatePath("/review");
  return "Submitted for verification. A curator will check it against the paper.";
});
