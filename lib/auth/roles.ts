import type { AccountStatus, Role } from "@/models/user";

// Plain data about roles, safe to import from client components (models/user.ts pulls in Sequelize;
// only its types are used here). DESIGN §2: each role can do everything the one before it can.

export const ROLE_ORDER = ["reader", "contributor", "curator", "admin"] as const satisfies readonly Role[];
export const STATUS_ORDER = ["pending", "active", "suspended", "declined"] as const satisfies readonly AccountStatus[];

// Fails to compile if models/user.ts gains a role or status that is missing here.
type Missing<All, Listed> = Exclude<All, Listed> extends never ? true : never;
const rolesComplete: Missing<Role, (typeof ROLE_ORDER)[number]> = true;
const statusesComplete: Missing<AccountStatus, (typeof STATUS_ORDER)[number]> = true;
void rolesComplete;
void statusesComplete;

export type { AccountStatus, Role };

export const ROLE_LABELS: Record<Role, string> = {
  reader: "Reader",
  contributor: "Contributor",
  curator: "Curator",
  admin: "Admin",
};

export const STATUS_LABELS: Record<AccountStatus, string> = {
  pending: "Awaiting review",
  active: "Active",
  suspended: "Suspended",
  declined: "Declined",
};

/** true when `role` includes everything `required` may do */
export function hasRole(role: Role, required: Role): boolean {
  return ROLE_ORDER.indexOf(role) >= ROLE_ORDER.indexOf(required);
}

export function isRole(value: unknown): value is Role {
  return typeof value === "string" && (ROLE_ORDER as readonly string[]).includes(value);
}
