import "server-only";
import { Transaction, UniqueConstraintError } from "sequelize";
import { createAudited, db, updateAudited } from "@/lib/db";
import { findCredentials, listActiveAdmins } from "@/lib/db/queries/users";
import { AppError } from "@/lib/errors";
import {
  queueAddressAlreadyRegistered,
  queueApplicationMails,
  queueApprovedMail,
  queueDeclinedMail,
  queuePasswordChangedMail,
  queueReactivatedMail,
  queueRoleChangedMail,
  queueSuspendedMail,
} from "@/lib/mail/notifications";
import type { ApplyInput } from "@/lib/validation/account";
import type { AccountStatus, Role, User } from "@/models/user";
import { forgetAccount } from "./account-cache";
import { consumeApplyAttempt, recordSignInFailure, signInBlock } from "./limits";
import { revokeResetTokens } from "./password-reset";
import { hashPassword, verifyPassword } from "./password";
import { creationValues } from "./creation-values";
import { ROLE_LABELS, STATUS_LABELS } from "./roles";
import { nextCutoff } from "./session-cutoff";

// Every change to an account: one transaction holding the change, its AuditEvent and the e-mail to the
// person concerned (outbox), so none of the three can happen without the others. A suspension, a decline
// and a password change also move the account's session cutoff (lib/auth/session-cutoff.ts) in that
// transaction, ending every session that began before it; a later reactivation or approval leaves the
// cutoff where it is, so those sessions stay ended.

interface Actor {
  id: number;
}

/**
 * Admin changes run in an IMMEDIATE transaction on SQLite (the write lock is taken at BEGIN, so two
 * admins acting at once are serialised and the second sees the first's result) and lock the admin rows
 * on PostgreSQL; either way "the last active admin" is counted after any concurrent change.
 */
async function adminChange<T>(work: (transaction: Transaction) => Promise<T>): Promise<T> {
  const { sequelize } = await db();
  return sequelize.transaction({ type: Transaction.TYPES.IMMEDIATE }, work);
}

async function loadTarget(userId: number, transaction: Transaction): Promise<User> {
  const { models } = await db();
  const target = await models.User.findByPk(userId, { transaction, lock: transaction.LOCK.UPDATE });
  if (!target) throw new AppError("not_found", "There is no such account.");
  return target;
}

function expectStatus(target: User, allowed: AccountStatus[], doing: string): void {
  const status = target.status as AccountStatus;
  if (!allowed.includes(status)) {
    throw new AppError("conflict", `${target.name}'s account is ${STATUS_LABELS[status].toLowerCase()}, so it cannot be ${doing}. Reload the page to see its current state.`);
  }
}

/** Refuses a change that would leave no active admin. */
async function keepAnAdmin(target: User, transaction: Transaction): Promise<void> {
  if (target.role !== "admin" || target.status !== "active") return;
  const { models } = await db();
  const admins = await models.User.findAll({ where: { role: "admin", status: "active" }, attributes: ["id"], transaction, lock: transaction.LOCK.UPDATE });
  if (admins.length <= 1) throw new AppError("conflict", `${target.name} is the last active admin. Make someone else an admin first.`);
}

function forgetAfterCommit(transaction: Transaction, userId: number): void {
  forgetAccount(userId);
  transaction.afterCommit(() => forgetAccount(userId));
}

// ---- applying ------------------------------------------------------------------------------------

/**
 * A new application: a `pending` contributor account, a note to every active admin and an
 * acknowledgement to the applicant. An address that already has an account gets a note instead and the
 * caller sees exactly the same outcome, so the form cannot be used to find out who has an account.
 */
export async function applyForAccount(input: ApplyInput, context: { address: string }): Promise<void> {
  consumeApplyAttempt({ address: context.address, email: input.email });
  // Hashed even when the address is taken, so both paths take the same time.
  const passwordHash = await hashPassword(input.password);
  const admins = await listActiveAdmins();
  const { models, sequelize } = await db();
  const noteToExisting = () =>
    sequelize.transaction((transaction) => queueAddressAlreadyRegistered({ email: input.email }, { actorId: null, transaction }));
  try {
    await sequelize.transaction(async (transaction) => {
      const existing = await models.User.findOne({ where: { email: input.email }, attributes: ["id"], transaction });
      if (existing) {
        await queueAddressAlreadyRegistered({ email: input.email }, { actorId: null, transaction });
        return;
      }
      await createAudited<User>(
        models.User,
        // role and status are fixed here, whatever the request body said
        creationValues<User>({ email: input.email, name: input.name, affiliation: input.affiliation, reason: input.reason, passwordHash, role: "contributor", status: "pending", statusNote: null }),
        { actorId: null, transaction, action: "apply" },
      );
      await queueApplicationMails({ applicant: { name: input.name, email: input.email, affiliation: input.affiliation, reason: input.reason }, admins }, { actorId: null, transaction });
    });
  } catch (error) {
    // Two applications for one address at the same moment: the second meets the unique index.
    if (error instanceof UniqueConstraintError) await noteToExisting();
    else throw error;
  }
}

// ---- admin decisions -----------------------------------------------------------------------------

export async function approvePerson({ actor, userId, role }: { actor: Actor; userId: number; role: Role }): Promise<string> {
  return adminChange(async (transaction) => {
    const target = await loadTarget(userId, transaction);
    expectStatus(target, ["pending", "declined"], "approved");
    await updateAudited(target, { status: "active", role, statusNote: null }, { actorId: actor.id, transaction, action: "approve" });
    await queueApprovedMail({ email: target.email, name: target.name, role }, { actorId: actor.id, transaction });
    forgetAfterCommit(transaction, target.id);
    return `${target.name} is now an active ${ROLE_LABELS[role].toLowerCase()} and has been sent an e-mail.`;
  });
}

export async function declinePerson({ actor, userId, reason }: { actor: Actor; userId: number; reason: string }): Promise<string> {
  return adminChange(async (transaction) => {
    const target = await loadTarget(userId, transaction);
    expectStatus(target, ["pending"], "declined");
    await updateAudited(target, { status: "declined", statusNote: reason, sessionsValidAfter: nextCutoff(target.sessionsValidAfter) }, { actorId: actor.id, transaction, action: "decline" });
    await queueDeclinedMail({ email: target.email, name: target.name, reason }, { actorId: actor.id, transaction });
    forgetAfterCommit(transaction, target.id);
    return `${target.name}'s application was declined; they have been sent the reason.`;
  });
}

export async function suspendPerson({ actor, userId, reason }: { actor: Actor; userId: number; reason: string }): Promise<string> {
  if (actor.id === userId) throw new AppError("forbidden", "You cannot suspend your own account.");
  return adminChange(async (transaction) => {
    const target = await loadTarget(userId, transaction);
    expectStatus(target, ["active"], "suspended");
    await keepAnAdmin(target, transaction);
    await updateAudited(target, { status: "suspended", statusNote: reason, sessionsValidAfter: nextCutoff(target.sessionsValidAfter) }, { actorId: actor.id, transaction, action: "suspend" });
    await queueSuspendedMail({ email: target.email, name: target.name, reason }, { actorId: actor.id, transaction });
    forgetAfterCommit(transaction, target.id);
    return `${target.name} is suspended and signed out; they have been sent the reason.`;
  });
}

export async function reactivatePerson({ actor, userId }: { actor: Actor; userId: number }): Promise<string> {
  return adminChange(async (transaction) => {
    const target = await loadTarget(userId, transaction);
    expectStatus(target, ["suspended"], "reactivated");
    await updateAudited(target, { status: "active", statusNote: null }, { actorId: actor.id, transaction, action: "reactivate" });
    await queueReactivatedMail({ email: target.email, name: target.name }, { actorId: actor.id, transaction });
    forgetAfterCommit(transaction, target.id);
    return `${target.name} is active again and has been sent an e-mail.`;
  });
}

export async function changeRole({ actor, userId, role }: { actor: Actor; userId: number; role: Role }): Promise<string> {
  if (actor.id === userId) throw new AppError("forbidden", "You cannot change your own role; another admin can.");
  return adminChange(async (transaction) => {
    const target = await loadTarget(userId, transaction);
    expectStatus(target, ["active"], "given another role");
    if (target.role === role) return `${target.name} already is a ${ROLE_LABELS[role].toLowerCase()}.`;
    if (role !== "admin") await keepAnAdmin(target, transaction);
    const previousRole = target.role;
    await updateAudited(target, { role }, { actorId: actor.id, transaction, action: "change-role" });
    await queueRoleChangedMail({ email: target.email, name: target.name, previousRole, role }, { actorId: actor.id, transaction });
    forgetAfterCommit(transaction, target.id);
    return `${target.name} is now a ${ROLE_LABELS[role].toLowerCase()} and has been told by e-mail.`;
  });
}

// ---- one's own account ---------------------------------------------------------------------------

export async function updateProfile({ user, name, affiliation }: { user: Actor; name: string; affiliation: string | null }): Promise<string> {
  const { sequelize } = await db();
  return sequelize.transaction(async (transaction) => {
    const row = await loadTarget(user.id, transaction);
    await updateAudited(row, { name, affiliation }, { actorId: user.id, transaction, action: "update-profile" });
    forgetAfterCommit(transaction, user.id);
    return "Your profile is saved.";
  });
}

/**
 * Changes one's own password and ends every session that began before the change, the caller's own
 * included; the caller renews its session from `sessionsValidAfter` (renewSession in lib/auth/session.ts).
 */
export async function changePassword(
  { user, currentPassword, newPassword }: { user: Actor & { email: string }; currentPassword: string; newPassword: string },
  context: { address: string },
): Promise<{ message: string; sessionsValidAfter: Date }> {
  const subject = { address: context.address, email: user.email };
  const blocked = signInBlock(subject);
  if (blocked) throw blocked;
  const credentials = await findCredentials({ userId: user.id });
  if (!credentials || !(await verifyPassword(currentPassword, credentials.passwordHash))) {
    // guessing the current password from a borrowed session counts like a failed sign-in
    recordSignInFailure(subject);
    throw new AppError("validation_failed", "Your current password was not accepted.", { fields: { currentPassword: ["That is not your current password."] } });
  }
  const passwordHash = await hashPassword(newPassword);
  const { sequelize } = await db();
  return sequelize.transaction(async (transaction) => {
    const row = await loadTarget(user.id, transaction);
    const sessionsValidAfter = nextCutoff(row.sessionsValidAfter);
    await updateAudited(row, { passwordHash, sessionsValidAfter }, { actorId: user.id, transaction, action: "change-password" });
    await revokeResetTokens({ userId: user.id, actorId: user.id, transaction });
    await queuePasswordChangedMail({ email: row.email, name: row.name }, { actorId: user.id, transaction });
    forgetAfterCommit(transaction, user.id);
    return { message: "Your password is changed and your other sessions are signed out. We have sent you an e-mail to confirm it.", sessionsValidAfter };
  });
}
