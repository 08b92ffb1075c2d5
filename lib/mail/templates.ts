import { compose, oneLine, type MailContent } from "./compose";

// The wording of every e-mail Fitledger sends. Pure functions of their arguments (links arrive complete),
// so they are tested without a server. `kind` names each template in the outbox.

export type MailKind =
  | "application-received"
  | "application-acknowledged"
  | "address-already-registered"
  | "account-approved"
  | "account-declined"
  | "account-suspended"
  | "account-reactivated"
  | "role-changed"
  | "password-reset"
  | "password-changed"
  | "entry-returned"
  | "search-digest"
  | "correction-received";

/** Kinds whose body holds a secret (a reset link): the sender blanks the body once it is delivered. */
export const SENSITIVE_KINDS: ReadonlySet<MailKind> = new Set(["password-reset"]);

const ROLE_NAMES: Record<string, string> = { reader: "reader", contributor: "contributor", curator: "curator", admin: "admin" };
const ROLE_CAN: Record<string, string> = {
  reader: "search and read the verified corpus, save searches and receive alerts",
  contributor: "code papers, import comparison sheets and submit entries for verification",
  curator: "code papers and verify or return the entries others submit",
  admin: "run the project: accounts, recheck settings and the audit log",
};

export function applicationReceived(input: { name: string; email: string; affiliation: string | null; reason: string; reviewUrl: string }): MailContent {
  return compose(`New account application: ${oneLine(input.name, 80)}`, [
    "Someone has applied for a Fitledger account and is waiting for a decision.",
    { facts: [["Name", input.name], ["E-mail", input.email], ["Affiliation", input.affiliation]] },
    { quote: input.reason, label: "Their reason:" },
    { link: input.reviewUrl, label: "Approve or decline on the people page" },
  ]);
}

export function applicationAcknowledged(input: { name: string }): MailContent {
  return compose("We have your Fitledger application", [
    `Hello ${input.name},`,
    "thank you for applying. An admin reads each application and decides, usually within a few working days. You will get an e-mail either way; until then you cannot sign in.",
  ]);
}

export function addressAlreadyRegistered(input: { signInUrl: string; resetUrl: string }): MailContent {
  return compose("An application used your address", [
    "Someone has just applied for a Fitledger account with this e-mail address. There is already an account for it, so no second account was made.",
    "If that was you, sign in with your existing account, or choose a new password if you have forgotten it. If it was not you, you can ignore this message; nothing has changed.",
    { link: input.signInUrl, label: "Sign in" },
    { link: input.resetUrl, label: "Choose a new password" },
  ]);
}

export function accountApproved(input: { name: string; role: string; signInUrl: string }): MailContent {
  return compose("Your Fitledger account is ready", [
    `Hello ${input.name},`,
    `an admin has approved your application. You can now sign in as a ${ROLE_NAMES[input.role] ?? input.role}, which lets you ${ROLE_CAN[input.role] ?? "use Fitledger"}.`,
    { link: input.signInUrl, label: "Sign in to Fitledger" },
  ]);
}

export function accountDeclined(input: { name: string; reason: string }): MailContent {
  return compose("Your Fitledger application", [
    `Hello ${input.name},`,
    "an admin has looked at your application and cannot approve it at present. They gave this reason:",
    { quote: input.reason },
    "The verified corpus stays open to everyone without an account. If you think this was a mistake, reply to the project's contact address.",
  ]);
}

export function accountSuspended(input: { name: string; reason: string }): MailContent {
  return compose("Your Fitledger account is suspended", [
    `Hello ${input.name},`,
    "an admin has suspended your account. You have been signed out and cannot sign in until it is reactivated. Your entries are kept as they are. The reason given:",
    { quote: input.reason },
  ]);
}

export function accountReactivated(input: { name: string; signInUrl: string }): MailContent {
  return compose("Your Fitledger account is active again", [
    `Hello ${input.name},`,
    "an admin has reactivated your account. You can sign in again with your existing password.",
    { link: input.signInUrl, label: "Sign in to Fitledger" },
  ]);
}

export function roleChanged(input: { name: string; previousRole: string; role: string }): MailContent {
  return compose("Your role on Fitledger has changed", [
    `Hello ${input.name},`,
    `an admin has changed your role from ${ROLE_NAMES[input.previousRole] ?? input.previousRole} to ${ROLE_NAMES[input.role] ?? input.role}. You can now ${ROLE_CAN[input.role] ?? "use Fitledger"}. The change applies from your next page.`,
  ]);
}

export function passwordReset(input: { name: string; resetUrl: string; expiresInMinutes: number }): MailContent {
  return compose("Choose a new Fitledger password", [
    `Hello ${input.name},`,
    `someone (hopefully you) asked to reset the password of this account. The link below works once, for the next ${input.expiresInMinutes} minutes.`,
    { link: input.resetUrl, label: "Choose a new password" },
    "If you did not ask for this, ignore this message: your password stays as it is.",
  ]);
}

export function passwordChanged(input: { name: string; resetUrl: string }): MailContent {
  return compose("Your Fitledger password was changed", [
    `Hello ${input.name},`,
    "the password of your account has just been changed, and wherever else you were signed in has been signed out. If that was you, there is nothing to do.",
    "If it was not you, choose a new password at once and tell an admin.",
    { link: input.resetUrl, label: "Choose a new password" },
  ]);
}

export function entryReturned(input: { name: string; paperTitle: string; comment: string; entryUrl: string }): MailContent {
  return compose(`Your entry was returned: ${oneLine(input.paperTitle, 120)}`, [
    `Hello ${input.name},`,
    "a curator has checked your entry against the paper and returned it to you for changes:",
    { facts: [["Paper", input.paperTitle]] },
    { quote: input.comment, label: "The curator's comment:" },
    "Fix what the comment asks for and submit the entry again; it stays out of the public corpus until it is verified.",
    { link: input.entryUrl, label: "Open the entry in your workbench" },
  ]);
}
