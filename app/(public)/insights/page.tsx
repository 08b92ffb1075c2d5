import type { Metadata } from "next";
import Link from "next/link";
import { CautionNotice } from "@/components/caution-notice";
import { IntervalBars, type IntervalBar } from "@/components/charts/interval-bars";
import { TrendLine } from "@/components/charts/trend-line";
import { InsightsFigure } from "@/components/insights-figure";
import { StatTile } from "@/components/stat-tile";
import { Notice } from "@/components/ui/notice";
import { getCurrentUser } from "@/lib/auth/current-user";
import { readCorpusStats } from "@/lib/db/queries/stats";
import { isAppError } from "@/lib/errors";
import { formatCount } from "@/lib/format";
import { findingTitle, METHOD_LABELS } from "@/lib/search/labels";
import { scopeForReader } from "@/lib/search/scope";
import { formatProportion, formatShareOnly } from "@/lib/stats/format";
import type { GroupPrevalence } from "@/lib/stats/prevalence";
import { codeTable, groupTable, trendTable, type FigureTable } from "@/lib/stats/tables";
import { filtersToQuery, hasAnyFilter, parseSearchQuery, searchParamsOf } from "@/lib/validation/search";

export const metadata: Metadata = { title: "Insights" };
export const dynamic = "force-dynamic";

type SearchParams = Promise<Record<string, string | string[] | undefined>>;

const day = (iso: string | null) => (iso ? iso.slice(0, 10) : "–");

function groupBars(groups: GroupPrevalence[], label: (value: string | number) => string = String): IntervalBar[] {
  return groups.map((group) => ({
    label: label(group.value),
    share: group.withError.share,
    low: group.withError.low,
    high: group.withError.high,
    note: `${formatShareOnly(group.withError)} (${group.withError.k}/${group.withError.n})`,
  }));
}

export default async function InsightsPage({ searchParams }: { searchParams: SearchParams }) {
  const [params, user] = await Promise.all([searchParams.then(searchParamsOf), getCurrentUser()]);
  const parsed = parseSearchQuery(params, { extra: ["trend"] });
  if (!parsed.ok) {
    return (
      <Notice tone="error" title="This address holds a selection we cannot read.">
        {Object.entries(parsed.problems).map(([name, messages]) => `${name}: ${messages.join("; ")}`).join(" · ")} — <Link href="/insights">see the whole corpus</Link>
      </Notice>
    );
  }
  const { filters, rest } = parsed.value;
  const scope = scopeForReader(user, filters);
  if (isAppError(scope)) return <Notice tone="error">{scope.message}</Notice>;
  const { snapshot, prevalence } = await readCorpusStats({ filters, scope: scope.kind === "staff" && filters.state.length === 0 ? { kind: "public" } : scope });
  const trendCode = rest.trend && prevalence.trends.some((trend) => trend.code === rest.trend) ? rest.trend : null;
  const query = filtersToQuery(filters).toString();
  const context = {
    source: "Fitledger",
    selection: query || "the whole verified corpus",
    snapshot,
    note: "Shares with Wilson (1927) 95 % score intervals. A finding is a possible inconsistency computed from the printed numbers, not evidence of misconduct.",
  };
  const tables: Record<string, FigureTable> = {
    codes: codeTable(prevalence),
    trend: trendTable(prevalence, trendCode),
    journal: groupTable("error-share-by-journal", "Share of comparisons with an error-level finding, by journal", "Journal", prevalence.byJournal),
    estimator: groupTable("error-share-by-estimator", "Share of comparisons with an error-level finding, by estimator", "Estimator", prevalence.byEstimator),
    method: groupTable("error-share-by-method", "Share of comparisons with an error-level finding, by method", "Method", prevalence.byMethod),
  };
  const trendPoints = tables.trend.rows.map((row) => ({ year: Number(row.year), share: row.share as number | null, low: row.low as number | null, high: row.high as number | null }));

  return (
    <div className="space-y-6">
      <header className="space-y-2">
        <h1 className="text-xl font-semibold tracking-tight">Insights</h1>
        <p className="max-w-3xl text-ink-soft">
          How often the recheck finds something in {hasAnyFilter(filters) ? "the selected comparisons" : "the verified corpus"}: the share of comparisons with each finding and the
          share of papers with at least one error-level finding, each with its Wilson 95 % interval, broken down by year, journal, estimator and method.
        </p>
        <p className="text-xs text-ink" data-testid="snapshot-line">
          Corpus snapshot of {day(snapshot.computedAt)}: {formatCount(snapshot.verifiedPapers)} verified papers, {formatCount(snapshot.verifiedComparisons)} verified comparisons (last
          verification {day(snapshot.lastVerifiedAt)}); recheck engine {snapshot.engineVersion}
          {snapshot.findingEngineVersions.length > 0 && snapshot.findingEngineVersions.join(",") !== snapshot.engineVersion ? ` (stored findings written by ${snapshot.findingEngineVersions.join(", ")})` : ""}.
        </p>
        <p className="text-xs text-ink-soft">
          Selection: {query ? <code className="break-all">{query}</code> : "the whole verified corpus"} ·{" "}
          <Link href={`/explore${query ? `?${query}` : ""}`}>{hasAnyFilter(filters) ? "change it in Explore" : "choose a part of it in Explore"}</Link>
        </p>
      </header>
      <CautionNotice />

      <dl className="grid grid-cols-2 gap-3 md:grid-cols-4">
        <StatTile label="Comparisons" value={formatCount(prevalence.comparisons)} detail={`in ${formatCount(prevalence.papers)} papers`} />
        <StatTile label="With an error-level finding" value={formatShareOnly(prevalence.comparisonsWithError)} detail={formatProportion(prevalence.comparisonsWithError)} />
        <StatTile label="With an error or warning" value={formatShareOnly(prevalence.comparisonsFlagged)} detail={formatProportion(prevalence.comparisonsFlagged)} />
        <StatTile label="Papers with an error-level finding" value={formatShareOnly(prevalence.papersWithError)} detail={`${formatProportion(prevalence.papersWithError)}; ${prevalence.papersWithError.k} of ${prevalence.papersWithError.n}`} />
      </dl>

      <InsightsFigure
        table={tables.codes}
        context={context}
        caption="Each bar is the share of comparisons with at least one finding of that code; the whisker is its Wilson 95 % interval."
        chart={
          <IntervalBars
            bars={prevalence.codes
              .filter((code) => code.comparisons.k > 0)
              .map((code) => ({ label: code.title, share: code.comparisons.share, low: code.comparisons.low, high: code.comparisons.high, note: `${formatShareOnly(code.comparisons)} (${code.comparisons.k})` }))}
          />
        }
      />

      <InsightsFigure
        table={tables.trend}
        context={context}
        caption={
          <form method="get" className="flex flex-wrap items-center gap-2">
            {[...filtersToQuery(filters)].map(([key, value], at) => (
              <input key={`${key}-${at}`} type="hidden" name={key} value={value} />
            ))}
            <label htmlFor="trend-code">Trend of</label>
            <select id="trend-code" name="trend" defaultValue={trendCode ?? ""} className="rounded border border-rule-strong bg-paper-raised px-1 py-0.5">
              <option value="">any error-level finding</option>
              {prevalence.trends.map((trend) => (
                <option key={trend.code} value={trend.code}>
                  {findingTitle(trend.code)}
                </option>
              ))}
            </select>
            <button type="submit" className="rounded border border-rule-strong px-2 py-0.5 hover:bg-paper-sunk">
              Show
            </button>
            <span>The line is the share per publication year, the band its Wilson 95 % interval.</span>
          </form>
        }
        chart={<TrendLine points={trendPoints} />}
      />

      <InsightsFigure table={tables.journal} context={context} chart={<IntervalBars tone="error" bars={groupBars(prevalence.byJournal)} />} />
      <InsightsFigure table={tables.estimator} context={context} chart={<IntervalBars tone="error" bars={groupBars(prevalence.byEstimator)} />} />
      <InsightsFigure table={tables.method} context={context} chart={<IntervalBars tone="error" bars={groupBars(prevalence.byMethod, (value) => METHOD_LABELS[String(value)] ?? String(value))} />} />
      <p className="text-xs text-ink-faint">
        The same figures as JSON for scripts: <a href={`/api/stats${query ? `?${query}` : ""}`}>/api/stats{query ? `?${query}` : ""}</a>. Intervals: Wilson, E. B. (1927), Probable inference, the law of
        succession, and statistical inference, JASA 22, 209–212.
      </p>
    </div>
  );
}
