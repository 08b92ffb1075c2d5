import type { Role } from "@/lib/auth/roles";

/** The header's sections. A feature adds its entry here when its page exists. */
export interface NavItem {
  href: string;
  label: string;
  /** shown only to signed-in people whose role reaches this one */
  minRole?: Role;
}

export const NAV_ITEMS: NavItem[] = [
  { href: "/", label: "Overview" },
  { href: "/explore", label: "Explore" },
  { href: "/insights", label: "Insights" },
];

/** Entries of the signed-in person's menu, by the role they need. */
export const ACCOUNT_NAV_ITEMS: NavItem[] = [
  { href: "/workbench", label: "Workbench", minRole: "contributor" },
  { href: "/workbench/import", label: "Import a sheet", minRole: "contributor" },
  { href: "/review", label: "Review", minRole: "curator" },
  { href: "/review/corrections", label: "Corrections", minRole: "curator" },
  { href: "/admin/people", label: "People", minRole: "admin" },
  { href: "/admin/outbox", label: "Outbox", minRole: "admin" },
  { href: "/admin/recheck", label: "Full recheck", minRole: "admin" },
];
