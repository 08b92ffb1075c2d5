import type { Metadata } from "next";
import Link from "next/link";
import { SavedSearches } from "@/components/saved-searches";
import { requireSignedIn } from "@/lib/auth/current-user";

export const metadata: Metadata = { title: "Saved searches" };
export const dynamic = "force-dynamic";

export default async function SavedSearchesPage() {
  const user = await requireSignedIn("/explore/saved");
  return (
    <div className="max-w-4xl space-y-4">
      <header className="space-y-1">
        <h1 className="text-xl font-semibold tracking-tight">Saved searches</h1>
        <p className="text-ink-soft">
          Open a search to see its current results. With alerts on, a daily e-mail lists the comparisons verified since the last one that match it.
          Save new searches from <Link href="/explore">Explore</Link>.
        </p>
      </header>
      <SavedSearches userId={user.id} />
    </div>
  );
}
