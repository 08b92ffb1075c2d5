"use client";

import { FindingList } from "@/components/finding-list";
import { FINDING_CATALOGUE, type FindingCode } from "@/lib/recheck/catalogue";
import type { LiveFindings } from "@/lib/curation/live";

// The live recheck beside the entry form: what the engine (running here, in the browser) would raise for
// the figures as typed, with the numbers and the plain-language explanation.

export function LiveFindingsPanel({ results }: { results: LiveFindings[] }) {
  const total = results.reduce((sum, result) => sum + result.findings.length, 0);
  return (
    <section aria-labelledby="live-recheck-heading" aria-live="polite" className="space-y-2 rounded border border-rule bg-paper-sunk p-3" data-testid="live-recheck">
      <h2 id="live-recheck-heading" className="text-sm font-semibold">
        Live recheck <span className="font-normal text-ink-soft">— {total === 0 ? "nothing to report so far" : `${total} finding${total === 1 ? "" : "s"}`}</span>
      </h2>
      <p className="text-xxs text-ink-soft">Recomputed from the figures as you type them. A finding here is often a coding slip: check the cell against the paper before submitting.</p>
      {results.map((result) => (
        <div key={result.owner} className="space-y-1">
          <h3 className="text-xs font-medium">{result.label}</h3>
          {result.unreadable.length > 0 ? (
            <ul className="text-xxs text-finding-error">
              {result.unreadable.map((error, index) => (
                <li key={index}>
                  {error.column ? `${error.column}: ` : ""}
                  {error.message}
                </li>
              ))}
            </ul>
          ) : null}
          <FindingList
            anchor={false}
            findings={result.findings.map((finding, index) => {
              const entry = FINDING_CATALOGUE[finding.code as FindingCode];
              return { id: `${result.owner}-${index}`, code: finding.code, severity: finding.severity, title: entry?.title ?? finding.code, message: finding.message, explanation: entry?.explanation ?? "", source: entry?.source ?? "", values: finding.values };
            })}
            empty={result.unreadable.length === 0 ? <p className="text-xxs text-ink-soft">No findings.</p> : null}
          />
        </div>
      ))}
    </section>
  );
}
