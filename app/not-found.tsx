import Link from "next/link";

export default function NotFound() {
  return (
    <div className="max-w-xl space-y-3 py-10">
      <p className="text-xs uppercase tracking-wide text-ink-faint">404</p>
      <h1 className="text-xl font-semibold">No page at this address</h1>
      <p className="text-ink-soft">
        The entry may not be verified yet, or the link may be mistyped. Only verified entries are public.
      </p>
      <p>
        <Link href="/">Back to the overview</Link>
      </p>
    </div>
  );
}
