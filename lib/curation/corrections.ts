import "server-only";
import { createHash } from "node:crypto";
import { Op } from "sequelize";
import { db, createAudited, updateAudited } from "@/lib/db";
import { AppError } from "@/lib/errors";
import { appLink, queueMail } from "@/lib/mail";
import { compose, oneLine } from "@/lib/mail/compose";
import type { MailKind } from "@/lib/mail/templates";
import { createRateLimiter, type RateLimiter } from "@/lib/rate-limit";
import { rateLimited } from "@/lib/auth/limits";

// "Send a correction" on a public paper page (DESIGN §9): stored first, then every curator is told
// through the outbox in the same transaction. Anyone may send one, so it is rate-limited per network
// address and per paper.

const HOUR = 3_600_000;
type Limits = { byAddress: RateLimiter; byPaper: RateLimiter };
const globalForLimits = globalThis as typeof globalThis & { __fitledgerCorrectionLimits?: Limits };
const limits = () => (globalForLimits.__fitledgerCorrectionLimits ??= { byAddress: createRateLimiter({ limit: 5, windowMs: HOUR }), byPaper: createRateLimiter({ limit: 20, windowMs: HOUR }) });

export function clearCorrectionLimits(): void {
  globalForLimits.__fitledgerCorrectionLimits = undefined;
}

// The wording of this message stays beside the feature that sends it; its kind is listed with the others.
const CORRECTION_KIND: MailKind = "correction-received";

export function correctionNotice(input: { paperTitle: string; name: string; email: string; message: string; pageUrl: string }) {
  return compose(`Correction sent for: ${oneLine(input.paperTitle, 120)}`, [
    "Someone has sent a correction from a paper's public page. Please read it and check the entry against the paper.",
    { facts: [["Paper", input.paperTitle], ["From", `${input.name} <${input.email}>`]] },
    { quote: input.message, label: "Their message:" },
    { link: input.pageUrl, label: "Open the paper's page" },
  ]);
}

export async function sendCorrection(input: { paperId: number; name: string; email: string; message: string; address: string }): Promise<void> {
  const { models, sequelize } = await db();
  const paper = await models.Paper.findOne({ where: { id: input.paperId, state: "verified" }, attributes: ["id", "title"] });
  if (!paper) throw new AppError("not_found", "Corrections can be sent for verified papers only.");
  const addressHash = createHash("sha256").update(input.address).digest("hex");
  const { byAddress, byPaper } = limits();
  const blocked = rateLimited([byAddress.peek(addressHash), byPaper.peek(String(paper.id))], "corrections from here");
  if (blocked) throw blocked;
  byAddress.consume(addressHash);
  byPaper.consume(String(paper.id));
  await sequelize.transaction(async (transaction) => {
    await createAudited(models.Correction, { paperId: paper.id, name: input.name, email: input.email, message: input.message, addressHash }, { actorId: null, transaction, action: "send-correction" });
    const curators = await models.User.findAll({ where: { role: { [Op.in]: ["curator", "admin"] }, status: "active" }, attributes: ["email"], transaction });
    const content = correctionNotice({ paperTitle: paper.title, name: input.name, email: input.email, message: input.message, pageUrl: appLink(`/papers/${paper.id}`) });
    await queueMail(curators.map((curator) => ({ to: curator.email, kind: CORRECTION_KIND, content })), { actorId: null, transaction });
  });
}

/** Closes or reopens a correction, audited. A missing correction is a clear 404, not a silent no-op. */
export async function setCorrectionStatus({ correctionId, status, actor }: { correctionId: number; status: "open" | "closed"; actor: { id: number } }): Promise<void> {
  const { models, sequelize } = await db();
  await sequelize.transaction(async (transaction) => {
    const correction = await models.Correction.findByPk(correctionId, { transaction });
    if (!correction) throw new AppError("not_found", "That correction no longer exists.");
    await updateAudited(correction, { status }, { actorId: actor.id, transaction, action: status === "closed" ? "close" : "reopen" });
  });
}
