import "server-only";
import { env } from "@/lib/env";
import { queueMail, type QueueContext } from "./outbox";
import * as templates from "./templates";

// One function per event that mails someone: builds the message with absolute links to this app and
// queues it inside the caller's transaction.

export function appLink(path: string): string {
  return new URL(path, env.APP_URL).toString();
}

interface Person {
  email: string;
  name: string;
}

export function queueApplicationMails(input: { applicant: Person & { affiliation: string | null; reason: string }; admins: Person[] }, context: QueueContext) {
  const notice = templates.applicationReceived({ ...input.applicant, reviewUrl: appLink("/admin/people?status=pending") });
  return queueMail(
    [
      ...input.admins.map((admin) => ({ to: admin.email, kind: "application-received" as const, content: notice })),
      { to: input.applicant.email, kind: "application-acknowledged" as const, content: templates.applicationAcknowledged({ name: input.applicant.name }) },
    ],
    context,
  );
}

export function queueAddressAlreadyRegistered(input: { email: string }, context: QueueContext) {
  return queueMail({ to: input.email, kind: "address-already-registered", content: templates.addressAlreadyRegistered({ signInUrl: appLink("/signin"), resetUrl: appLink("/reset") }) }, context);
}

export function queueApprovedMail(person: Person & { role: string }, context: QueueContext) {
  return queueMail({ to: person.email, kind: "account-approved", content: templates.accountApproved({ name: person.name, role: person.role, signInUrl: appLink("/signin") }) }, context);
}

export function queueDeclinedMail(person: Person & { reason: string }, context: QueueContext) {
  return queueMail({ to: person.email, kind: "account-declined", content: templates.accountDeclined(person) }, context);
}

export function queueSuspendedMail(person: Person & { reason: string }, context: QueueContext) {
  return queueMail({ to: person.email, kind: "account-suspended", content: templates.accountSuspended(person) }, context);
}

export function queueReactivatedMail(person: Person, context: QueueContext) {
  return queueMail({ to: person.email, kind: "account-reactivated", content: templates.accountReactivated({ name: person.name, signInUrl: appLink("/signin") }) }, context);
}

export function queueRoleChangedMail(person: Person & { previousRole: string; role: string }, context: QueueContext) {
  return queueMail({ to: person.email, kind: "role-changed", content: templates.roleChanged(person) }, context);
}

export function queuePasswordResetMail(person: Person & { token: string; expiresInMinutes: number }, context: QueueContext) {
  const resetUrl = appLink(`/reset/new?token=${encodeURIComponent(person.token)}`);
  return queueMail({ to: person.email, kind: "password-reset", content: templates.passwordReset({ name: person.name, resetUrl, expiresInMinutes: person.expiresInMinutes }) }, context);
}

export function queuePasswordChangedMail(person: Person, context: QueueContext) {
  return queueMail({ to: person.email, kind: "password-changed", content: templates.passwordChanged({ name: person.name, resetUrl: appLink("/reset") }) }, context);
}

/**
 * "Your entry was returned" — for the curation workflow: call it inside the transaction that sets the
 * paper's state to `returned`. `entryPath` is the contributor's page for the entry (default: workbench).
 */
export function queueEntryReturnedMail(
  input: { to: string; name: string; paperTitle: string; comment: string; entryPath?: string },
  context: QueueContext,
) {
  const content = templates.entryReturned({ name: input.name, paperTitle: input.paperTitle, comment: input.comment, entryUrl: appLink(input.entryPath ?? "/workbench") });
  return queueMail({ to: input.to, kind: "entry-returned", content }, context);
}
