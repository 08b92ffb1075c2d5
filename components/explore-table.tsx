"use client";

import Link from "next/link";
import {
  columnVisibilityFeature,
  createColumnHelper,
  rowSortingFeature,
  tableFeatures,
  useTable,
  type ColumnVisibilityState,
  type SortingState,
  type Updater,
} from "@tanstack/react-table";
import { SeverityBadge } from "@/components/severity-badge";
import type { Severity } from "@/lib/recheck/types";
import type { ComparisonHit } from "@/lib/search/engine";
import { DISPOSITION_LABELS, findingTitle, METHOD_LABELS } from "@/lib/search/labels";
import type { SortKey, SortValue } from "@/lib/validation/search";

// The results table of Explore (@tanstack/react-table v9: useTable with explicit features). The server
// sorts and pages (manualSorting; the rows arrive as one sorted page), the table owns the headers, the
// sort state and the column choice, both of which live in the URL.

const features = tableFeatures({ rowSortingFeature, columnVisibilityFeature });
const helper = createColumnHelper<typeof features, ComparisonHit>();

/** the columns a reader may hide, and their names in the column menu and the `cols` URL parameter */
export const OPTIONAL_COLUMNS = [
  { id: "year", label: "Year" },
  { id: "journal", label: "Journal" },
  { id: "method", label: "Method" },
  { id: "models", label: "Models and estimators" },
  { id: "groups", label: "Groups" },
  { id: "findings", label: "Findings" },
] as const;
export type OptionalColumn = (typeof OPTIONAL_COLUMNS)[number]["id"];
export const DEFAULT_COLUMNS: OptionalColumn[] = ["year", "journal", "method", "models", "findings"];

/** the column whose header sorts by each sort key */
const SORT_OF_COLUMN: Record<string, SortKey> = { paper: "title", year: "year", journal: "journal", comparison: "comparison", method: "method", groups: "groups", findings: "findings" };

const columns = helper.columns([
  helper.accessor((hit) => hit.paper.title, {
    id: "paper",
    header: "Paper",
    enableHiding: false,
    cell: ({ row }) => (
      <div className="min-w-[16rem]">
        <Link href={row.original.href} className="font-medium">
          {row.original.paper.title}
        </Link>
        <div className="text-xs text-ink-soft">{row.original.paper.authors}</div>
        {row.original.paper.state !== "verified" ? <div className="text-xxs uppercase tracking-wide text-finding-warning">{row.original.paper.state}</div> : null}
      </div>
    ),
  }),
  helper.accessor((hit) => hit.paper.year, { id: "year", header: "Year", sortDescFirst: true, cell: (info) => <span className="figures">{info.getValue() ?? "–"}</span> }),
  helper.accessor((hit) => hit.paper.journal, { id: "journal", header: "Journal", cell: (info) => <span className="text-ink-soft">{info.getValue() ?? "–"}</span> }),
  helper.accessor((hit) => hit.label, {
    id: "comparison",
    header: "Comparison",
    enableHiding: false,
    cell: ({ row }) => (
      <div>
        <div>{row.original.label}</div>
        <div className="text-xs text-ink-faint">{row.original.sample.label}</div>
      </div>
    ),
  }),
  helper.accessor((hit) => hit.method, { id: "method", header: "Method", cell: (info) => (info.getValue() ? METHOD_LABELS[info.getValue()!] ?? info.getValue() : "–") }),
  helper.display({
    id: "models",
    header: "Models (A restricted, B free)",
    cell: ({ row }) => (
      <div className="text-xs">
        <div>
          A: {row.original.restricted.label} <span className="text-ink-faint">{row.original.restricted.estimator ?? ""}</span>
        </div>
        <div>
          B: {row.original.free.label} <span className="text-ink-faint">{row.original.free.estimator ?? ""}</span>
        </div>
      </div>
    ),
  }),
  helper.accessor((hit) => hit.sample.groups, { id: "groups", header: "Groups", sortDescFirst: true, cell: (info) => <span className="figures">{info.getValue()}</span> }),
  helper.accessor((hit) => hit.findings.length, {
    id: "findings",
    header: "Findings",
    sortDescFirst: true,
    cell: ({ row }) =>
      row.original.findings.length === 0 ? (
        <span className="text-xs text-ink-faint">none</span>
      ) : (
        <ul className="min-w-[13rem] space-y-0.5">
          {row.original.findings.map((finding, position) => (
            <li key={`${finding.code}-${position}`} className="flex items-center gap-1.5 text-xs">
              <SeverityBadge severity={finding.severity as Severity} />
              <span title={finding.code}>{findingTitle(finding.code)}</span>
              {finding.disposition !== "none" ? <span className="text-ink-faint">({DISPOSITION_LABELS[finding.disposition]})</span> : null}
            </li>
          ))}
        </ul>
      ),
  }),
]);

export function sortingFromValue(sort: SortValue): SortingState {
  const descending = sort.startsWith("-");
  const key = descending ? sort.slice(1) : sort;
  const column = Object.entries(SORT_OF_COLUMN).find(([, value]) => value === key)?.[0];
  return column ? [{ id: column, desc: descending }] : [];
}

function valueFromSorting(sorting: SortingState): SortValue | undefined {
  const first = sorting[0];
  if (!first) return undefined;
  const key = SORT_OF_COLUMN[first.id];
  return key ? ((first.desc ? `-${key}` : key) as SortValue) : undefined;
}

export function ExploreTable({
  items,
  sort,
  visible,
  onSortChange,
  busy,
}: {
  items: ComparisonHit[];
  sort: SortValue;
  visible: OptionalColumn[];
  onSortChange: (sort: SortValue) => void;
  busy: boolean;
}) {
  const sorting = sortingFromValue(sort);
  const columnVisibility: ColumnVisibilityState = Object.fromEntries(OPTIONAL_COLUMNS.map((column) => [column.id, visible.includes(column.id)]));
  const table = useTable({
    features,
    columns,
    data: items,
    getRowId: (hit) => String(hit.id),
    manualSorting: true,
    enableSortingRemoval: false,
    enableMultiSort: false,
    state: { sorting, columnVisibility },
    onSortingChange: (updater: Updater<SortingState>) => {
      const next = typeof updater === "function" ? updater(sorting) : updater;
      const value = valueFromSorting(next);
      if (value) onSortChange(value);
    },
    onColumnVisibilityChange: () => undefined, // the column menu writes the URL; the table only reads it
  });

  return (
    <div className="relative overflow-x-auto">
      <table className={`w-full border-collapse text-left ${busy ? "opacity-60" : ""}`} aria-busy={busy || undefined}>
        <thead>
          {table.getHeaderGroups().map((group) => (
            <tr key={group.id} className="border-b border-rule-strong text-xs text-ink-faint">
              {group.headers.map((header) => {
                const sortable = header.column.id in SORT_OF_COLUMN;
                const direction = header.column.getIsSorted();
                return (
                  <th
                    key={header.id}
                    scope="col"
                    className="py-1.5 pr-3 align-bottom font-medium"
                    aria-sort={direction === "asc" ? "ascending" : direction === "desc" ? "descending" : sortable ? "none" : undefined}
                  >
                    {sortable ? (
                      <button type="button" onClick={header.column.getToggleSortingHandler()} className="inline-flex items-center gap-1 font-medium text-ink-soft hover:text-ink">
                        <table.FlexRender header={header} />
                        <span aria-hidden="true" className="text-ink-faint">
                          {direction === "asc" ? "▲" : direction === "desc" ? "▼" : "↕"}
                        </span>
                      </button>
                    ) : (
                      <table.FlexRender header={header} />
                    )}
                  </th>
                );
              })}
            </tr>
          ))}
        </thead>
        <tbody>
          {table.getRowModel().rows.map((row) => (
            <tr key={row.id} className="border-b border-rule align-top">
              {row.getVisibleCells().map((cell) => (
                <td key={cell.id} className="py-1.5 pr-3">
                  <table.FlexRender cell={cell} />
                </td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
