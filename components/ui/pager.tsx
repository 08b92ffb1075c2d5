import Link from "next/link";

/** "Previous / Page 2 of 5 / Next" for a paged list; `hrefFor` builds each page's address. */
export function Pager({ page, pageSize, total, hrefFor, label = "Pages" }: { page: number; pageSize: number; total: number; hrefFor: (page: number) => string; label?: string }) {
  const pages = Math.max(1, Math.ceil(total / pageSize));
  if (pages <= 1) return null;
  const linkClass = "rounded border border-rule px-2 py-0.5 hover:bg-paper-sunk hover:no-underline";
  return (
    <nav aria-label={label} className="flex items-center gap-3 text-xs text-ink-soft">
      {page > 1 ? (
        <Link href={hrefFor(page - 1)} className={linkClass} rel="prev">
          Previous
        </Link>
      ) : null}
      <span className="figures">
        Page {Math.min(page, pages)} of {pages}
      </span>
      {page < pages ? (
        <Link href={hrefFor(page + 1)} className={linkClass} rel="next">
          Next
        </Link>
      ) : null}
    </nav>
  );
}
