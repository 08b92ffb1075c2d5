// Who may do what to an entry, and which state each step leads to (DESIGN §3 entry state, §2 roles).
// Pure, so the workbench can show only the buttons that will work and the server enforces the same table.
import { hasRole, type Role } from "@/lib/auth/roles";
import type { EntryState } from "@/models/paper";

export interface Actor {
  id: number;
  role: Role;
}

export interface EntryFacts {
  state: EntryState;
  createdBy: number;
}

export type EntryStep = "submit" | "return" | "verify";

/**
 * The state machine: draft → submitted → returned → submitted → … → verified. A verified entry can be
 * returned too, when a correction (from its authors, a reader or a curator) shows the coding needs to
 * change: it leaves the public corpus until a curator verifies it again.
 */
export const STEPS: Record<EntryStep, { from: readonly EntryState[]; to: EntryState }> = {
  submit: { from: ["draft", "returned"], to: "submitted" },
  return: { from: ["submitted", "verified"], to: "returned" },
  verify: { from: ["submitted"], to: "verified" },
};

export const isOwner = (entry: EntryFacts, actor: Actor) => entry.createdBy === actor.id;

/** Reading an unverified entry (its page, its history): the person who coded it and curators. */
export function canRead(entry: EntryFacts, actor: Actor | null): boolean {
  if (entry.state === "verified") return true;
  if (!actor) return false;
  return isOwner(entry, actor) || hasRole(actor.role, "curator");
}

/** Changing the coding: the coder while it is theirs to change (draft, returned); a curator while it is under review. */
export function canEditCoding(entry: EntryFacts, actor: Actor): boolean {
  if (entry.state === "verified") return false;
  if (isOwner(entry, actor) && (entry.state === "draft" || entry.state === "returned")) return true;
  return hasRole(actor.role, "curator") && (entry.state === "submitted" || entry.state === "returned");
}

/** Why `actor` may not take `step` on `entry`, or null when they may. */
export function stepRefusal(step: EntryStep, entry: EntryFacts, actor: Actor): string | null {
  const rule = STEPS[step];
  if (!rule.from.includes(entry.state)) {
    const allowed = rule.from.join(" or ");
    return `This entry is ${entry.state}; only a ${allowed} entry can be ${step === "submit" ? "submitted" : step === "return" ? "returned" : "verified"}.`;
  }
  if (step === "submit") return isOwner(entry, actor) || hasRole(actor.role, "curator") ? null : "Only the person who coded this entry can submit it.";
  if (!hasRole(actor.role, "curator")) return "Only a curator can do this.";
  // four-eyes rule: the person who coded an entry never verifies it
  if (step === "verify" && isOwner(entry, actor)) return "You coded this entry yourself; another curator has to verify it.";
  return null;
}
