"use client";

import { signOut } from "next-auth/react";
import Link from "next/link";
import { usePathname, useRouter } from "next/navigation";
import { useEffect, useState } from "react";
import { hasRole, isRole, ROLE_LABELS, type Role } from "@/lib/auth/roles";
import { ACCOUNT_NAV_ITEMS } from "./site-nav-items";

// The header's right-hand side. It asks next-auth's session endpoint on every navigation rather than
// having the root layout read cookies, so public pages stay static; the same request also lets
// next-auth clear the cookie of a session whose account was suspended meanwhile.

type Viewer = { state: "loading" } | { state: "anonymous" } | { state: "signed-in"; name: string; role: Role };

async function fetchViewer(): Promise<Viewer> {
  const response = await fetch("/api/auth/session", { cache: "no-store" });
  const body = (await response.json().catch(() => ({}))) as { user?: { name?: string; role?: unknown } };
  if (!body.user || !isRole(body.user.role)) return { state: "anonymous" };
  return { state: "signed-in", name: body.user.name ?? "", role: body.user.role };
}

export function UserMenu() {
  const pathname = usePathname();
  const router = useRouter();
  const [viewer, setViewer] = useState<Viewer>({ state: "loading" });

  useEffect(() => {
    let current = true;
    fetchViewer()
      .then((next) => current && setViewer(next))
      .catch(() => current && setViewer({ state: "anonymous" }));
    return () => {
      current = false;
    };
  }, [pathname]);

  if (viewer.state === "loading") return <span className="inline-block h-5 w-32" aria-hidden="true" />;
  if (viewer.state === "anonymous") {
    return (
      <ul className="flex items-center gap-4">
        <li>
          <Link href="/join" className="text-ink-soft hover:text-ink">
            Apply
          </Link>
        </li>
        <li>
          <Link href={`/signin?next=${encodeURIComponent(pathname || "/")}`} className="font-medium">
            Sign in
          </Link>
        </li>
      </ul>
    );
  }

  const items = ACCOUNT_NAV_ITEMS.filter((item) => !item.minRole || hasRole(viewer.role, item.minRole));
  async function leave() {
    await signOut({ redirect: false });
    setViewer({ state: "anonymous" });
    router.push("/");
    router.refresh(); // server components drop what they rendered for the signed-in person
  }
  return (
    <div className="flex items-center gap-4">
      <ul className="flex items-center gap-4">
        {items.map((item) => (
          <li key={item.href}>
            <Link href={item.href} className="text-ink-soft hover:text-ink">
              {item.label}
            </Link>
          </li>
        ))}
      </ul>
      <details className="relative">
        <summary className="cursor-pointer list-none rounded border border-rule px-2 py-0.5 text-ink hover:bg-paper-sunk">
          {viewer.name} <span className="text-xs text-ink-faint">{ROLE_LABELS[viewer.role]}</span>
        </summary>
        <div className="absolute right-0 z-10 mt-1 w-44 rounded border border-rule bg-paper-raised py-1 shadow-sm">
          <Link href="/account" className="block px-3 py-1.5 text-ink hover:bg-paper-sunk hover:no-underline">
            Your account
          </Link>
          <button type="button" onClick={leave} className="block w-full px-3 py-1.5 text-left text-ink hover:bg-paper-sunk">
            Sign out
          </button>
        </div>
      </details>
    </div>
  );
}
