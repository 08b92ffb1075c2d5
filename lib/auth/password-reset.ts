import "server-only";
import { createHash, randomBytes } from "node:crypto";
import { Op, type Transaction } from "sequelize";
import { createAudited, db, recordEvent, updateAudited } from "@/lib/db";
import { AppError } from "@/lib/errors";
import { queuePasswordChangedMail, queuePasswordResetMail } from "@/lib/mail/notifications";
import { forgetAccount } from "./account-cache";
import { creationValues } from "./creation-values";
import { consumeResetAttempt } from "./limits";
import { hashPassword } from "./password";
import { nextCutoff } from "./session-cutoff";
import type { PasswordResetToken } from "@/models/password-reset-token";

// Password reset by e-mailed link. The token is 32 random bytes; only its SHA-256 hash is stored (a
// fast hash is enough for a random 256-bit value, unlike a password). It works once, for an hour. A
// reset ends every session of the account (someone may have the old password or a stolen session).

export const RESET_TTL_MINUTES = 60;
const INVALID_LINK = "This reset link has expired or has already been used.";

export function hashResetToken(token: string): string {
  return createHash("sha256").update(token, "utf8").digest("hex");
}

/**
 * Sends a reset link to an active account with this address. The caller's outcome is the same
 * whether or not there is one, so the form reveals nothing about who has an account.
 */
export async function requestPasswordReset({ email }: { email: string }, context: { address: string }): Promise<void> {
  consumeResetAttempt({ address: context.address, email });
  const { models, sequelize } = await db();
  const user = await models.User.findOne({ where: { email, status: "active" }, attributes: ["id", "email", "name"] });
  if (!user) return;
  const token = randomBytes(32).toString("base64url");
  await sequelize.transaction(async (transaction) => {
    // auditValues leaves tokenHash out of the log
    await createAudited<PasswordResetToken>(
      models.PasswordResetToken,
      creationValues<PasswordResetToken>({ userId: user.id, tokenHash: hashResetToken(token), expiresAt: new Date(Date.now() + RESET_TTL_MINUTES * 60_000), usedAt: null }),
      { actorId: null, transaction, action: "request" },
    );
    await queuePasswordResetMail({ email: user.email, name: user.name, token, expiresInMinutes: RESET_TTL_MINUTES }, { actorId: null, transaction });
  });
}

/** Marks every unused link of a person used (after a reset or a password change). */
export async function revokeResetTokens({ userId, actorId, transaction }: { userId: number; actorId: number | null; transaction: Transaction }): Promise<void> {
  const { models } = await db();
  const open = await models.PasswordResetToken.findAll({ where: { userId, usedAt: null }, attributes: ["id", "usedAt"], transaction });
  for (const row of open) await updateAudited(row, { usedAt: new Date() }, { actorId, transaction, action: "revoke" });
}

/** Sets a new password with a token from the e-mail. Expired, used or unknown tokens change nothing. */
export async function resetPassword({ token, password }: { token: string; password: string }, now = new Date()): Promise<void> {
  const { models, sequelize } = await db();
  const tokenHash = hashResetToken(token);
  const passwordHash = await hashPassword(password);
  await sequelize.transaction(async (transaction) => {
    const row = await models.PasswordResetToken.findOne({ where: { tokenHash }, attributes: ["id", "userId", "expiresAt", "usedAt"], transaction });
    if (!row) throw new AppError("bad_request", INVALID_LINK);
    // The conditional update is what makes a link single use, even for two requests at the same moment.
    const [claimed] = await models.PasswordResetToken.update(
      { usedAt: now },
      { where: { id: row.id, usedAt: null, expiresAt: { [Op.gt]: now } }, transaction },
    );
    if (claimed !== 1) throw new AppError("bad_request", INVALID_LINK);
    await recordEvent({ entity: "PasswordResetToken", entityId: row.id, action: "use", before: { usedAt: null }, after: { usedAt: now } }, { actorId: row.userId, transaction });

    const user = await models.User.findByPk(row.userId, { transaction });
    if (!user || user.status !== "active") throw new AppError("bad_request", INVALID_LINK);
    // the cutoff is taken here, after the slow password hash, so no session begun meanwhile survives
    await updateAudited(user, { passwordHash, sessionsValidAfter: nextCutoff(user.sessionsValidAfter) }, { actorId: user.id, transaction, action: "reset-password" });
    await revokeResetTokens({ userId: user.id, actorId: user.id, transaction });
    await queuePasswordChangedMail({ email: user.email, name: user.name }, { actorId: user.id, transaction });
    transaction.afterCommit(() => forgetAccount(user.id));
  });
}
