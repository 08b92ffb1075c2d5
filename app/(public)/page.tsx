import { CautionNotice } from "@/components/caution-notice";
import { StatTile } from "@/components/stat-tile";
import { readCorpusFigures } from "@/lib/db/queries/corpus";
import { formatCount, formatShare } from "@/lib/format";

// Figures are read from the database on every request; nothing here may be prerendered at build time.
export const dynamic = "force-dynamic";

export default async function LandingPage() {
  const figures = await readCorpusFigures();
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

      <CautionNotice />
    </div>
  );
}
