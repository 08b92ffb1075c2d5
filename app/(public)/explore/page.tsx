import type { Metadata } from "next";
import { Suspense } from "react";
import { CautionNotice } from "@/components/caution-notice";
import { ExploreSaveForm } from "@/components/explore-save-form";
import { ExploreView, type ExplorePage } from "@/components/explore-view";
import { Notice } from "@/components/ui/notice";
import { getCurrentUser } from "@/lib/auth/current-user";
import { hasRole } from "@/lib/auth/roles";
import { isAppError } from "@/lib/errors";
import { searchComparisons } from "@/lib/search";
import { scopeForReader } from "@/lib/search/scope";
import { filtersToQuery, parseSearchQuery, searchParamsOf } from "@/lib/validation/search";

export const metadata: Metadata = { title: "Explore" };
export const dynamic = "force-dynamic";

type SearchParams = Promise<Record<string, string | string[] | undefined>>;

/** The first page of results for this address, rendered on the server; the client takes over from here. */
export default async function ExploreRoute({ searchParams }: { searchParams: SearchParams }) {
  const [params, user] = await Promise.all([searchParams.then(searchParamsOf), getCurrentUser()]);
  const parsed = parseSearchQuery(params, { paging: true, extra: ["cols"] });
  let initial: ExplorePage | null = null;
  let initialKey = "";
  let refusal: string | null = null;
  if (parsed.ok) {
    const scope = scopeForReader(user, parsed.value.filters);
    if (isAppError(scope)) refusal = scope.message;
    else {
      const result = await searchComparisons({ filters: parsed.value.filters, paging: parsed.value.paging, scope });
      initial = { items: result.items, total: result.total, papers: result.papers, page: result.page, per_page: result.perPage, pages: result.pages, facets: result.facets };
      initialKey = filtersToQuery(parsed.value.filters, parsed.value.paging).toString();
    }
  }
  return (
    <div className="space-y-4">
      <header className="space-y-1">
        <h1 className="text-xl font-semibold tracking-tight">Explore the verified comparisons</h1>
        <p className="max-w-3xl text-ink-soft">
          Every comparison curators have verified, with the findings of the recheck. Narrow by finding, method, estimator, year or journal; the counts
          beside each choice say how many comparisons it would leave. The address holds the whole search, so you can bookmark or share it.
        </p>
      </header>
      {refusal ? <Notice tone="error">{refusal}</Notice> : null}
      <Suspense fallback={<p className="text-ink-faint">Loading the search…</p>}>
        <ExploreView initial={initial} initialKey={initialKey} signedIn={user !== null} ownEntries={user !== null && hasRole(user.role, "contributor")} saveForm={user ? <ExploreSaveForm /> : undefined} />
      </Suspense>
      <CautionNotice />
    </div>
  );
}
