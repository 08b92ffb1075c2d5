import Link from "next/link";
import { LedgerMark } from "./ledger-mark";
import { NAV_ITEMS } from "./site-nav-items";
import { UserMenu } from "./user-menu";

export function SiteHeader() {
  return (
    <header className="border-b border-rule bg-paper-raised">
      <div className="mx-auto flex max-w-6xl items-center gap-6 px-4 py-2.5">
        <Link href="/" className="flex items-center gap-2 font-semibold tracking-tight text-ink hover:no-underline">
          <LedgerMark className="h-5 w-5 text-ledger" />
          <span className="text-base">Fitledger</span>
        </Link>
        <nav aria-label="Main">
          <ul className="flex items-center gap-4">
            {NAV_ITEMS.map((item) => (
              <li key={item.href}>
                <Link href={item.href} className="text-ink-soft hover:text-ink">
                  {item.label}
                </Link>
              </li>
            ))}
          </ul>
        </nav>
        <nav aria-label="Account" className="ml-auto">
          <UserMenu />
        </nav>
      </div>
    </header>
  );
}
