import "server-only";
import type { Transaction } from "sequelize";
import { db, updateAudited } from "@/lib/db";
import { recordWithdrawal } from "@/lib/db/queries/search";
import { AppError } from "@/lib/errors";
import { queueEntryReturnedMail } from "@/lib/mail";
import type { EntryState } from "@/models/paper";
import { STEPS, stepRefusal, type Actor, type EntryStep } from "./rules";

// The entry's steps (DESIGN §3): submit, return with a comment (the coder is e-mailed through the
// outbox, in the same transaction), verify (never by the person who coded it). Each step is one audited
// update of the paper that only succeeds from the state it was checked in.

async function step(step: EntryStep, paperId: number, actor: Actor, apply: (paper: { title: string; createdBy: number; state: EntryState }) => Record<string, unknown>, after?: (input: { transaction: Transaction; paper: { id: number; title: string; createdBy: number } }) => Promise<void>, expectedVersion?: number): Promise<EntryState> {
  const { models, sequelize } = await db();
  return sequelize.transaction(async (transaction) => {
    const paper = await models.Paper.findOne({ where: { id: paperId }, transaction });
    if (!paper) throw new AppError("not_found", "There is no such paper.");
    const refusal = stepRefusal(step, paper, actor);
    if (refusal) throw new AppError(refusal.startsWith("This entry is") ? "conflict" : "forbidden", refusal);
    if (expectedVersion !== undefined && paper.version !== expectedVersion) {
      throw new AppError("conflict", `This entry was saved by someone else since you opened it (version ${expectedVersion} → ${paper.version}). Reload it and check before submitting.`);
    }
    const changes = { ...apply(paper), state: STEPS[step].to };
    // only from the state that was checked: a second curator acting at the same moment finds nothing to change
    const [updated] = await models.Paper.update({ state: changes.state }, { where: { id: paperId, state: paper.state }, transaction, validate: false });
    if (updated !== 1) throw new AppError("conflict", "Someone else changed this entry's state a moment ago; reload to see where it stands.");
    // the audited update records the step with the state before and after (the row in memory still has the old state)
    await updateAudited(paper, changes as never, { actorId: actor.id, transaction, action: step });
    if (after) await after({ transaction, paper });
    return STEPS[step].to;
  });
}

export function submitEntry({ paperId, version, actor }: { paperId: number; version?: number; actor: Actor }) {
  return step("submit", paperId, actor, () => ({ submittedAt: new Date(), curatorComment: null }), undefined, version);
}

export function returnEntry({ paperId, comment, actor }: { paperId: number; comment: string; actor: Actor }) {
  let wasVerified = false;
  return step(
    "return",
    paperId,
    actor,
    (paper) => {
      wasVerified = paper.state === "verified";
      return { curatorComment: comment };
    },
    async ({ transaction, paper }) => {
      const { models } = await db();
      // a verified entry leaves the public corpus: public searches must not be answered from an index built before
      if (wasVerified) await recordWithdrawal({ transaction, actorId: actor.id });
      const coder = await models.User.findOne({ where: { id: paper.createdBy }, attributes: ["email", "name"], transaction });
      if (coder) await queueEntryReturnedMail({ to: coder.email, name: coder.name, paperTitle: paper.title, comment, entryPath: `/workbench/papers/${paper.id}` }, { actorId: actor.id, transaction });
    },
  );
}

export function verifyEntry({ paperId, actor }: { paperId: number; actor: Actor }) {
  return step("verify", paperId, actor, () => ({ verifiedBy: actor.id, verifiedAt: new Date(), curatorComment: null }));
}
