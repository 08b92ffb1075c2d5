import { CautionNotice } from "@/components/caution-notice";
import { SeverityBadge } from "@/components/severity-badge";
import { StatTile } from "@/components/stat-tile";
import { readCorpusFigures, readFrequentFindings } from "@/lib/db/queries/corpus";
import { FINDING_CATALOGUE, type FindingCode } from "@/lib/recheck";
import type { Severity } from "@/lib/recheck/types";
import { formatCount, formatShare } from "@/lib/format";

// Figures are read from the database on every request; nothing here may be prerendered at build time.
export const dynamic = "force-dynamic";

export default async function LandingPage() {
  const [figures, frequent] = await Promise.all([readCorpusFigures(), readFrequentFindings({ limit: 8 })]);
  return (
    <div className="space-y-8">
      <section className="max-w-3xl space-y-3">
        <h1 className="text-2xl font-semibold tracking-tight">Every reported model comparison, recomputed.</h1>
        <p className="text-base text-ink-soft">
          Fitledger is a shared, curated ledger of the model comparisons printed in structural equation modelling,
          factor analysis and path analysis papers. Contributors code each paper&apos;s models and tests; every
          chi-square difference, p-value, scaled difference, RMSEA, CFI and information criterion is recomputed from
          the printed numbers with rounding-aware tolerance; curators verify each entry against the paper.
        </p>
        <form action="/explore" method="get" role="search" className="flex max-w-xl gap-2">
          <label htmlFor="landing-q" className="sr-only">
            Search the verified comparisons
          </label>
          <input id="landing-q" name="q" type="search" maxLength={200} placeholder="Search titles, authors, journals, DOIs, model labels" className="w-full rounded border border-rule-strong bg-paper-raised px-2.5 py-1.5 text-sm" />
          <button type="submit" className="rounded border border-ledger bg-ledger px-3 py-1.5 text-sm font-medium text-paper-raised hover:bg-ledger-deep">
            Search
          </button>
        </form>
      </section>

      <section aria-labelledby="corpus-figures">
        <h2 id="corpus-figures" className="mb-3 text-xs font-medium uppercase tracking-wide text-ink-faint">
          The corpus today
        </h2>
        <dl className="grid grid-cols-2 gap-3 md:grid-cols-4">
          <StatTile label="Papers coded" value={formatCount(figures.papers)} detail="all entry states" />
          <StatTile
            label="Verified papers"
            value={formatCount(figures.verifiedPapers)}
            detail={`${formatShare(figures.verifiedPapers, figures.papers)} of coded papers`}
          />
          <StatTile label="Verified comparisons" value={formatCount(figures.verifiedComparisons)} detail="public corpus" />
          <StatTile
            label="Flagged comparisons"
            value={formatShare(figures.flaggedComparisons, figures.verifiedComparisons)}
            detail={`${formatCount(figures.flaggedComparisons)} with an error or warning finding`}
          />
        </dl>
      </section>

      <section aria-labelledby="frequent-findings" className="max-w-3xl">
        <h2 id="frequent-findings" className="mb-3 text-xs font-medium uppercase tracking-wide text-ink-faint">
          Most frequent findings in verified entries
        </h2>
        {frequent.length === 0 ? (
          <p className="rounded border border-rule bg-paper-raised p-4 text-ink-soft">No verified entry has a finding yet.</p>
        ) : (
          <table className="w-full border-collapse text-left">
            <thead>
              <tr className="border-b border-rule-strong text-xs text-ink-faint">
                <th scope="col" className="py-1.5 pr-3 font-medium">Finding</th>
                <th scope="col" className="py-1.5 pr-3 font-medium">Severity</th>
                <th scope="col" className="py-1.5 text-right font-medium">Comparisons</th>
                <th scope="col" className="py-1.5 text-right font-medium">Share</th>
              </tr>
            </thead>
            <tbody>
              {frequent.map((finding) => {
                const entry = FINDING_CATALOGUE[finding.code as FindingCode];
                return (
                  <tr key={finding.code} className="border-b border-rule align-top">
                    <td className="py-1.5 pr-3">
                      <span className="font-medium">{entry?.title ?? finding.code}</span>
                      <code className="ml-2 text-xxs text-ink-faint">{finding.code}</code>
                    </td>
                    <td className="py-1.5 pr-3">
                      <SeverityBadge severity={finding.severity as Severity} />
                    </td>
                    <td className="py-1.5 text-right">{formatCount(finding.comparisons)}</td>
                    <td className="py-1.5 text-right">{formatShare(finding.comparisons, figures.verifiedComparisons)}</td>
                  </tr>
                );
              })}
            </tbody>
          </table>
        )}
      </section>

      <CautionNotice />
    </div>
  );
}
