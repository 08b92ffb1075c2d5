"use server";

import { revalidatePath } from "next/cache";
import { actionWithRole } from "@/lib/auth/guard";
import { setCorrectionStatus } from "@/lib/curation/corrections";
import { correctionStatusSchema } from "@/lib/validation/curation";

export const changeCorrectionStatus = actionWithRole("curator", correctionStatusSchema, async (input, user) => {
  await setCorrectionStatus({ correctionId: input.correctionId, status: input.status, actor: user });
  revalidatePath("/review/corrections");
  return input.status === "closed" ? "Marked as dealt with." : "Opened again.";
});
