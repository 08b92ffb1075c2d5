"use client";

import Link from "next/link";
import { usePathname, useRouter, useSearchParams } from "next/navigation";
import { useEffect, useMemo, useState, type ReactNode } from "react";
import { ExploreFacets } from "@/components/explore-facets";
import { DEFAULT_COLUMNS, ExploreTable, OPTIONAL_COLUMNS, type OptionalColumn } from "@/components/explore-table";
import { Notice } from "@/components/ui/notice";
import { formatCount } from "@/lib/format";
import type { ComparisonHit, Facets } from "@/lib/search/engine";
import { filtersToQuery, hasAnyFilter, parseSearchQuery, EMPTY_FILTERS, type Paging, type SearchFilters } from "@/lib/validation/search";

// Explore in the browser. The address is the state: filters, text, sort, page and column choice are
// read from the URL, every change pushes a new address (so back/forward and bookmarks work), and the
// results for an address are fetched from GET /api/comparisons. The server renders the first address's
// results, so a shared link shows its table without a loading step.

export interface ExplorePage {
  items: ComparisonHit[];
  total: number;
  papers: number;
  page: number;
  per_page: number;
  pages: number;
  facets: Facets;
}

interface Result {
  key: string;
  attempt: number;
  data?: ExplorePage;
  error?: string;
}

function readColumns(value: string | undefined): OptionalColumn[] {
  if (value === undefined) return DEFAULT_COLUMNS;
  const known = OPTIONAL_COLUMNS.map((column) => column.id as string);
  return value.split(",").filter((id): id is OptionalColumn => known.includes(id));
}

function addressOf(filters: SearchFilters, paging: Partial<Paging>, columns: OptionalColumn[]): string {
  const params = filtersToQuery(filters, paging);
  const sameColumns = columns.length === DEFAULT_COLUMNS.length && DEFAULT_COLUMNS.every((column) => columns.includes(column));
  if (!sameColumns) params.set("cols", OPTIONAL_COLUMNS.map((column) => column.id).filter((id) => columns.includes(id)).join(","));
  const text = params.toString();
  return text ? `?${text}` : "";
}

export function ExploreView({ initial, initialKey, signedIn, ownEntries = false, saveForm }: { initial: ExplorePage | null; initialKey: string; signedIn: boolean; ownEntries?: boolean; saveForm?: ReactNode }) {
  const router = useRouter();
  const pathname = usePathname();
  const searchParams = useSearchParams();
  const parsed = useMemo(() => parseSearchQuery(new URLSearchParams(searchParams.toString()), { paging: true, extra: ["cols"] }), [searchParams]);
  const apiKey = parsed.ok ? filtersToQuery(parsed.value.filters, parsed.value.paging).toString() : "";
  // the data on screen and the address it belongs to; while they differ from the address, a fetch is under way
  const [result, setResult] = useState<Result>({ key: initial ? initialKey : "\u0000", attempt: 0, data: initial ?? undefined });
  const [attempt, setAttempt] = useState(0);
  const current = result.key === apiKey && result.attempt === attempt;

  useEffect(() => {
    if (!parsed.ok || current) return;
    const controller = new AbortController();
    fetch(`/api/comparisons${apiKey ? `?${apiKey}` : ""}`, { signal: controller.signal, headers: { accept: "application/json" } })
      .then(async (response) => {
        const body = (await response.json()) as ExplorePage | { error: { message: string } };
        if (!response.ok || "error" in body) throw new Error("error" in body ? body.error.message : `The search answered ${response.status}.`);
        setResult({ key: apiKey, attempt, data: body });
      })
      .catch((error: unknown) => {
        if (controller.signal.aborted) return;
        setResult((previous) => ({ key: apiKey, attempt, data: previous.data, error: error instanceof Error ? error.message : "The search failed." }));
      });
    return () => controller.abort();
  }, [apiKey, attempt, parsed.ok, current]);

  if (!parsed.ok) {
    return (
      <Notice tone="error" title="This address holds a search we cannot read.">
        <ul className="list-disc pl-5">
          {Object.entries(parsed.problems).map(([name, messages]) => (
            <li key={name}>
              <code>{name}</code>: {messages.join("; ")}
            </li>
          ))}
        </ul>
        <Link href={pathname}>Start a new search</Link>
      </Notice>
    );
  }

  const { filters, paging } = parsed.value;
  const columns = readColumns(parsed.value.rest.cols);
  const go = (nextFilters: SearchFilters, nextPaging: Partial<Paging>, nextColumns = columns) => router.push(`${pathname}${addressOf(nextFilters, nextPaging, nextColumns)}`, { scroll: false });
  const changeFilters = (next: SearchFilters) => {
    if (next.yearFrom !== undefined && next.yearTo !== undefined && next.yearFrom > next.yearTo) next = { ...next, yearFrom: next.yearTo, yearTo: next.yearFrom };
    go(next, { sort: paging.sort, perPage: paging.perPage, page: 1 });
  };
  const data = result.data;
  const busy = !current;
  const failure = current ? result.error : undefined;
  const exportQuery = filtersToQuery(filters).toString();

  return (
    <div className="grid gap-6 md:grid-cols-[15rem_1fr]">
      <aside aria-label="Filters" className="order-2 md:order-1">
        {data ? <ExploreFacets facets={data.facets} filters={filters} onChange={changeFilters} /> : <p className="text-xs text-ink-faint">Loading filters…</p>}
      </aside>

      <section aria-labelledby="results-heading" className="order-1 min-w-0 space-y-3 md:order-2">
        <form
          role="search"
          key={filters.q ?? ""}
          className="flex gap-2"
          onSubmit={(event) => {
            event.preventDefault();
            const q = String(new FormData(event.currentTarget).get("q") ?? "").trim();
            changeFilters({ ...filters, q: q || undefined });
          }}
        >
          <label htmlFor="explore-q" className="sr-only">
            Search titles, authors, journals, DOIs and model labels
          </label>
          <input
            id="explore-q"
            name="q"
            type="search"
            defaultValue={filters.q ?? ""}
            maxLength={200}
            placeholder="Title, author, journal, DOI or model label — small typos are fine"
            className="w-full rounded border border-rule-strong bg-paper-raised px-2.5 py-1.5 text-sm"
          />
          <button type="submit" className="rounded border border-ledger bg-ledger px-3 py-1.5 text-sm font-medium text-paper-raised hover:bg-ledger-deep">
            Search
          </button>
        </form>

        <div className="flex flex-wrap items-center gap-x-4 gap-y-1">
          <h2 id="results-heading" className="text-sm font-medium" aria-live="polite">
            {data ? (
              <>
                <span data-testid="result-count">{formatCount(data.total)}</span> {data.total === 1 ? "comparison" : "comparisons"} in {formatCount(data.papers)} {data.papers === 1 ? "paper" : "papers"}
              </>
            ) : (
              "Searching…"
            )}
          </h2>
          {busy ? (
            <span role="status" className="text-xs text-ink-faint">
              Updating…
            </span>
          ) : null}
          {hasAnyFilter(filters) ? (
            <button type="button" className="text-xs text-ledger hover:underline" onClick={() => go(EMPTY_FILTERS, { sort: paging.sort, perPage: paging.perPage })}>
              Clear all filters
            </button>
          ) : null}
          {ownEntries ? (
            <label className="flex items-center gap-1 text-xs">
              <input key={String(filters.mine)} type="checkbox" className="accent-ledger" defaultChecked={filters.mine} onChange={() => changeFilters({ ...filters, mine: !filters.mine, state: [] })} />
              Only my own entries (any state)
            </label>
          ) : null}
          <div className="ml-auto flex items-center gap-3 text-xs">
            <ColumnMenu columns={columns} onChange={(next) => go(filters, paging, next)} />
            <a href={`/api/export?format=csv${exportQuery ? `&${exportQuery}` : ""}`} download>
              Download CSV
            </a>
            <a href={`/api/export?format=json${exportQuery ? `&${exportQuery}` : ""}`}>JSON</a>
            <a href={`/insights${exportQuery ? `?${exportQuery}` : ""}`}>Statistics for these results</a>
          </div>
        </div>

        {failure ? (
          <Notice tone="error" title="The search did not answer.">
            {failure}{" "}
            <button type="button" className="underline" onClick={() => setAttempt(attempt + 1)}>
              Try again
            </button>
          </Notice>
        ) : null}

        {data && data.total === 0 ? (
          <div className="rounded border border-rule bg-paper-raised p-4 text-ink-soft" role="status">
            <p>No {filters.mine ? "entry of yours" : "verified comparison"} matches this search.</p>
            {hasAnyFilter(filters) ? (
              <button type="button" className="mt-1 text-ledger hover:underline" onClick={() => go(EMPTY_FILTERS, {})}>
                Clear all filters
              </button>
            ) : null}
          </div>
        ) : null}

        {data && data.total > 0 ? (
          <>
            <ExploreTable items={data.items} sort={paging.sort} visible={columns} busy={busy} onSortChange={(sort) => go(filters, { sort, perPage: paging.perPage, page: 1 })} />
            <nav aria-label="Result pages" className="flex items-center gap-3 text-xs text-ink-soft">
              <button type="button" disabled={paging.page <= 1} onClick={() => go(filters, { ...paging, page: paging.page - 1 })} className="rounded border border-rule px-2 py-0.5 hover:bg-paper-sunk disabled:opacity-50">
                Previous
              </button>
              <span className="figures">
                Page {Math.min(paging.page, data.pages)} of {formatCount(data.pages)}
              </span>
              <button type="button" disabled={paging.page >= data.pages} onClick={() => go(filters, { ...paging, page: paging.page + 1 })} className="rounded border border-rule px-2 py-0.5 hover:bg-paper-sunk disabled:opacity-50">
                Next
              </button>
              <label className="ml-auto flex items-center gap-1">
                Rows per page
                <select value={paging.perPage} onChange={(event) => go(filters, { sort: paging.sort, perPage: Number(event.target.value), page: 1 })} className="rounded border border-rule-strong bg-paper-raised px-1 py-0.5">
                  {[25, 50, 100, 200].map((size) => (
                    <option key={size} value={size}>
                      {size}
                    </option>
                  ))}
                </select>
              </label>
            </nav>
          </>
        ) : null}

        {signedIn && saveForm ? saveForm : null}
      </section>
    </div>
  );
}

function ColumnMenu({ columns, onChange }: { columns: OptionalColumn[]; onChange: (columns: OptionalColumn[]) => void }) {
  return (
    <details className="relative">
      <summary className="cursor-pointer text-ledger">Columns</summary>
      <fieldset className="absolute right-0 z-10 mt-1 w-56 space-y-1 rounded border border-rule bg-paper-raised p-2 shadow-sm">
        <legend className="sr-only">Columns to show</legend>
        {OPTIONAL_COLUMNS.map((column) => (
          <label key={column.id} className="flex items-center gap-1.5">
            <input
              type="checkbox"
              className="accent-ledger"
              checked={columns.includes(column.id)}
              onChange={() => onChange(columns.includes(column.id) ? columns.filter((id) => id !== column.id) : [...columns, column.id])}
            />
            {column.label}
          </label>
        ))}
      </fieldset>
    </details>
  );
}
