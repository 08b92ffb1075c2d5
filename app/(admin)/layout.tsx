import Link from "next/link";
import type { ReactNode } from "react";
import { Notice } from "@/components/ui/notice";
import { requireRole } from "@/lib/auth/current-user";

const SECTIONS = [
  { href: "/admin/people", label: "People" },
  { href: "/admin/outbox", label: "Outbox" },
  { href: "/admin/recheck", label: "Full recheck" },
];

/** Admin pages. The role is checked here for the page and again by every action's guard. */
export default async function AdminLayout({ children }: { children: ReactNode }) {
  const { allowed } = await requireRole("admin", "/admin/people");
  if (!allowed) {
    return (
      <Notice tone="error" title="Admins only">
        These pages are for project admins. If you need one of them, ask an admin.
      </Notice>
    );
  }
  return (
    <div className="space-y-5">
      <nav aria-label="Admin" className="border-b border-rule pb-2">
        <ul className="flex gap-4 text-sm">
          {SECTIONS.map((section) => (
            <li key={section.href}>
              <Link href={section.href} className="text-ink-soft hover:text-ink">
                {section.label}
              </Link>
            </li>
          ))}
        </ul>
      </nav>
      {children}
    </div>
  );
}
