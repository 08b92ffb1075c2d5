"use server";

import { revalidatePath } from "next/cache";
import { redirect } from "next/navigation";
import { actionWithRole } from "@/lib/auth/guard";
import { createPaper } from "@/lib/curation/create";
import { submitEntry } from "@/lib/curation/workflow";
import { newPaperSchema, submitEntrySchema } from "@/lib/validation/curation";

/** New paper from the form (DOI lookup, BibTeX/RIS or typed): a known DOI opens the existing paper. */
export const createPaperFromForm = actionWithRole("contributor", newPaperSchema, async (input, user) => {
  const outcome = await createPaper(input, user);
  if (!outcome.created) redirect(`/workbench/papers/${outcome.existingPaperId}?existing=1`);
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
