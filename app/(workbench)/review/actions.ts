"use server";

import { revalidatePath } from "next/cache";
import { actionWithRole } from "@/lib/auth/guard";
import { recordDisposition } from "@/lib/curation/dispositions";
import { returnEntry, verifyEntry } from "@/lib/curation/workflow";
import { dispositionSchema, returnEntrySchema, verifyEntrySchema } from "@/lib/validation/curation";

function refresh(paperId: number) {
  revalidatePath("/review");
  revalidatePath(`/review/${paperId}`);
  revalidatePath(`/papers/${paperId}`);
  revalidatePath("/workbench");
}

export const verifyPaperEntry = actionWithRole("curator", verifyEntrySchema, async (input, user) => {
  await verifyEntry({ paperId: input.paperId, actor: user });
  refresh(input.paperId);
  return "Verified. The entry is now public.";
});

export const returnPaperEntry = actionWithRole("curator", returnEntrySchema, async (input, user) => {
  await returnEntry({ paperId: input.paperId, comment: input.comment, actor: user });
  refresh(input.paperId);
  return "Returned to the contributor with your comment; they have been e-mailed.";
});

export const recordFindingVerdict = actionWithRole("curator", dispositionSchema, async (input, user) => {
  await recordDisposition({ ...input, actor: user });
  refresh(input.paperId);
  return "Verdict recorded.";
});
