"use client";

import { SortableTable, type SortableColumn } from "@/components/sortable-table";
import type { PaperComparisonView, PaperModelView, PaperSampleView } from "@/lib/db/queries/papers";

// The paper page's three tables (samples, models, comparisons), sortable in the browser. Each comparison
// row is anchored as `comparison-<id>`; the search page links there and `highlightComparison` marks it.

const FIGURE_LABELS: [keyof PaperModelView["figures"], string][] = [
  ["chisq", "χ²"],
  ["df", "df"],
  ["p", "p"],
  ["chisqScaled", "χ² scaled"],
  ["scaling", "c"],
  ["cfi", "CFI"],
  ["tli", "TLI"],
  ["rmsea", "RMSEA"],
  ["rmseaLo", "RMSEA lo"],
  ["rmseaHi", "RMSEA hi"],
  ["srmr", "SRMR"],
  ["aic", "AIC"],
  ["bic", "BIC"],
  ["loglik", "LL"],
  ["npar", "q"],
];

const METHOD_WORDS: Record<string, string> = { lrt: "χ² difference", scaled_lrt: "scaled χ² difference", ic: "information criteria", invariance: "invariance step" };

export function SamplesTable({ samples }: { samples: PaperSampleView[] }) {
  const columns: SortableColumn<PaperSampleView>[] = [
    { key: "label", label: "Sample", value: (row) => row.label },
    { key: "n", label: "N", value: (row) => row.n, numeric: true },
    { key: "groups", label: "Groups", value: (row) => row.groups, numeric: true },
    { key: "groupNs", label: "Group sizes", value: (row) => (row.groupNs ? row.groupNs.join(", ") : null) },
  ];
  return <SortableTable rows={samples} columns={columns} caption="Samples" rowId={(row) => row.id} />;
}

export function ModelsTable({ models, samples }: { models: PaperModelView[]; samples: PaperSampleView[] }) {
  const sampleLabel = new Map(samples.map((sample) => [sample.id, sample.label]));
  const shown = FIGURE_LABELS.filter(([figure]) => models.some((model) => model.figures[figure] !== undefined));
  const columns: SortableColumn<PaperModelView>[] = [
    { key: "label", label: "Model", value: (row) => row.label },
    ...(samples.length > 1 ? [{ key: "sample", label: "Sample", value: (row: PaperModelView) => sampleLabel.get(row.sampleId) ?? null }] : []),
    { key: "estimator", label: "Estimator", value: (row) => row.estimator },
    ...shown.map(([figure, label]): SortableColumn<PaperModelView> => ({ key: figure, label, value: (row) => row.figures[figure] ?? null, numeric: true })),
  ];
  return <SortableTable rows={models} columns={columns} caption="Reported models, figures as printed" rowId={(row) => row.id} rowAnchor={(row) => `model-${row.id}`} />;
}

export function ComparisonsTable({ comparisons, samples, findingCounts, highlightComparison }: { comparisons: PaperComparisonView[]; samples: PaperSampleView[]; findingCounts: Record<number, { error: number; warning: number; note: number }>; highlightComparison?: number }) {
  const sampleLabel = new Map(samples.map((sample) => [sample.id, sample.label]));
  const columns: SortableColumn<PaperComparisonView>[] = [
    { key: "label", label: "Comparison", value: (row) => row.label },
    ...(samples.length > 1 ? [{ key: "sample", label: "Sample", value: (row: PaperComparisonView) => sampleLabel.get(row.sampleId) ?? null }] : []),
    { key: "models", label: "A (restricted) vs B (free)", value: (row) => `${row.restrictedLabel} vs ${row.freeLabel}` },
    { key: "method", label: "Method", value: (row) => METHOD_WORDS[row.method] ?? row.method },
    { key: "nested", label: "Nested", value: (row) => row.nested },
    { key: "dChisq", label: "Δχ²", value: (row) => row.figures.dChisq ?? null, numeric: true },
    { key: "dDf", label: "Δdf", value: (row) => row.figures.dDf ?? null, numeric: true },
    { key: "dP", label: "p", value: (row) => row.figures.dP ?? null, numeric: true },
    { key: "dCfi", label: "ΔCFI", value: (row) => row.figures.dCfi ?? null, numeric: true },
    { key: "dRmsea", label: "ΔRMSEA", value: (row) => row.figures.dRmsea ?? null, numeric: true },
    { key: "dAic", label: "ΔAIC", value: (row) => row.figures.dAic ?? null, numeric: true },
    { key: "preferred", label: "Preferred", value: (row) => (row.preferred === "a" ? "A" : row.preferred === "b" ? "B" : row.preferred) },
    { key: "invariance", label: "Invariance claimed", value: (row) => (row.invarianceClaimed === "n/a" ? null : row.invarianceClaimed) },
    { key: "location", label: "Where", value: (row) => row.location },
    {
      key: "findings",
      label: "Findings",
      value: (row) => (findingCounts[row.id] ? findingCounts[row.id].error * 10_000 + findingCounts[row.id].warning * 100 + findingCounts[row.id].note : 0),
      render: (row) => {
        const counts = findingCounts[row.id];
        if (!counts) return <span className="text-ink-faint">none</span>;
        const parts = [counts.error ? `${counts.error} error` : "", counts.warning ? `${counts.warning} warning` : "", counts.note ? `${counts.note} note` : ""].filter(Boolean);
        return (
          <a href={`#findings-comparison-${row.id}`} className="underline">
            {parts.join(", ")}
          </a>
        );
      },
    },
  ];
  return <SortableTable rows={comparisons} columns={columns} caption="Reported comparisons" rowId={(row) => row.id} rowAnchor={(row) => `comparison-${row.id}`} highlightRow={(row) => row.id === highlightComparison} />;
}
