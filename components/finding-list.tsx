import type { ReactNode } from "react";
import { SeverityBadge } from "@/components/severity-badge";
import { FindingValues } from "@/components/finding-values";
import type { Severity } from "@/lib/recheck/types";

// Findings explained: the engine's message with its numbers, the catalogue's plain-language explanation
// and source, and the curator's verdict. Each finding is anchored as `finding-<flagId>`; findings whose
// code is `highlightCode` (the search page's ?finding=) are marked.

export interface FindingItem {
  id: number | string;
  code: string;
  severity: Severity;
  title: string;
  message: string;
  explanation: string;
  source: string;
  values: Record<string, unknown>;
  disposition?: { verdict: string; note: string | null; link: string | null; curatorName: string | null } | null;
}

export const VERDICT_WORDS: Record<string, string> = {
  confirmed: "Confirmed reporting error",
  coding_error: "Coding error (fixed)",
  explained: "Explained",
  engine_limitation: "Engine limitation",
};

export function FindingList({ findings, highlightCode, anchor = true, empty, renderExtra }: { findings: FindingItem[]; highlightCode?: string; anchor?: boolean; empty?: ReactNode; renderExtra?: (finding: FindingItem) => ReactNode }) {
  if (findings.length === 0) return empty ? <>{empty}</> : null;
  return (
    <ul className="space-y-2">
      {findings.map((finding) => {
        const highlighted = highlightCode !== undefined && finding.code === highlightCode;
        return (
          <li
            key={finding.id}
            id={anchor ? `finding-${finding.id}` : undefined}
            data-code={finding.code}
            data-highlighted={highlighted || undefined}
            className={`scroll-mt-20 rounded border px-3 py-2 ${highlighted ? "border-ledger bg-ledger-tint ring-2 ring-ledger" : "border-rule bg-paper-raised"}`}
          >
            <div className="flex flex-wrap items-baseline gap-2">
              <SeverityBadge severity={finding.severity} />
              <span className="font-medium">{finding.title}</span>
              <code className="text-xxs text-ink-faint">{finding.code}</code>
            </div>
            <p className="mt-1 text-sm">{finding.message}</p>
            <FindingValues values={finding.values} />
            {finding.explanation ? <p className="mt-1 text-xs text-ink-soft">{finding.explanation}</p> : null}
            {finding.source ? <p className="mt-0.5 text-xxs text-ink-faint">Rule: {finding.source}</p> : null}
            {finding.disposition !== undefined ? (
              <p className="mt-1 text-xs">
                <span className="font-medium">Curator&apos;s verdict: </span>
                {finding.disposition ? (
                  <>
                    {VERDICT_WORDS[finding.disposition.verdict] ?? finding.disposition.verdict}
                    {finding.disposition.curatorName ? ` (${finding.disposition.curatorName})` : ""}
                    {finding.disposition.note ? <span className="text-ink-soft"> — {finding.disposition.note}</span> : null}
                    {finding.disposition.link ? (
                      <>
                        {" "}
                        <a href={finding.disposition.link} rel="nofollow noopener" className="underline">
                          source
                        </a>
                      </>
                    ) : null}
                  </>
                ) : (
                  <span className="text-ink-soft">none recorded yet</span>
                )}
              </p>
            ) : null}
            {renderExtra ? renderExtra(finding) : null}
          </li>
        );
      })}
    </ul>
  );
}
