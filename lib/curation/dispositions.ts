import "server-only";
import { db, createAudited, recordEvent, updateAudited } from "@/lib/db";
import { AppError } from "@/lib/errors";
import { hasRole } from "@/lib/auth/roles";
import type { Verdict } from "@/models/flag-disposition";
import type { Actor } from "./rules";

// A curator's verdict on a finding. It is stored against the finding's fingerprint (code, subject,
// figures, owner), not the flag row, so it survives every recheck that leaves the finding unchanged and
// lapses by itself when the figures behind the finding change.

export async function recordDisposition(input: { paperId: number; flagId: number; verdict: Verdict; note: string; link: string; actor: Actor }): Promise<void> {
  if (!hasRole(input.actor.role, "curator")) throw new AppError("forbidden", "Only a curator can record a verdict on a finding.");
  const { models, sequelize } = await db();
  await sequelize.transaction(async (transaction) => {
    const flag = await models.Flag.findOne({ where: { id: input.flagId, paperId: input.paperId }, attributes: ["id", "paperId", "comparisonId", "fingerprint", "code"], transaction });
    if (!flag) throw new AppError("not_found", "This finding is no longer there: the entry was rechecked since the page was opened. Reload to see the current findings.");
    const values = { verdict: input.verdict, note: input.note || null, link: input.link || null, curatorId: input.actor.id };
    const context = { actorId: input.actor.id, transaction };
    const existing = await models.FlagDisposition.findOne({ where: { paperId: input.paperId, fingerprint: flag.fingerprint }, transaction });
    if (existing) await updateAudited(existing, values, context);
    else await createAudited(models.FlagDisposition, { paperId: flag.paperId, comparisonId: flag.comparisonId, fingerprint: flag.fingerprint, code: flag.code, ...values }, context);
    await recordEvent({ entity: "Paper", entityId: input.paperId, action: "disposition", after: { code: flag.code, verdict: input.verdict, note: values.note, link: values.link } }, context);
  });
}
