"use client";

import { useMemo, useState, type ReactNode } from "react";

// A plain table whose columns sort on a header click (or Enter/Space on the header's button); numbers
// sort as numbers, printed text ("< .001") by its leading number, blanks last.

export interface SortableColumn<Row> {
  key: string;
  label: string;
  /** the sort key: a number, text or null (blank) */
  value: (row: Row) => number | string | null;
  render?: (row: Row) => ReactNode;
  numeric?: boolean;
}

function sortKey(value: number | string | null): number | string | null {
  if (value === null || value === "") return null;
  if (typeof value === "number") return value;
  const number = /^[<>=≤≥\s]*(-?\d*\.?\d+(?:e-?\d+)?)/i.exec(value);
  return number ? Number(number[1]) : value.toLowerCase();
}

export function SortableTable<Row>({ rows, columns, caption, rowId, rowAnchor, highlightRow }: { rows: Row[]; columns: SortableColumn<Row>[]; caption: string; rowId: (row: Row) => string | number; rowAnchor?: (row: Row) => string; highlightRow?: (row: Row) => boolean }) {
  const [sort, setSort] = useState<{ key: string; direction: 1 | -1 } | null>(null);
  const sorted = useMemo(() => {
    if (!sort) return rows;
    const column = columns.find((candidate) => candidate.key === sort.key);
    if (!column) return rows;
    return [...rows].sort((a, b) => {
      const x = sortKey(column.value(a));
      const y = sortKey(column.value(b));
      if (x === null && y === null) return 0;
      if (x === null) return 1;
      if (y === null) return -1;
      if (typeof x === "number" && typeof y === "number") return (x - y) * sort.direction;
      return String(x).localeCompare(String(y)) * sort.direction;
    });
  }, [rows, columns, sort]);
  return (
    <div className="relative overflow-x-auto">
      <table className="w-full border-collapse text-left text-sm">
        <caption className="sr-only">{caption}</caption>
        <thead className="border-b border-rule-strong text-xs text-ink-faint">
          <tr>
            {columns.map((column) => {
              const active = sort?.key === column.key;
              return (
                <th key={column.key} scope="col" aria-sort={active ? (sort!.direction === 1 ? "ascending" : "descending") : "none"} className={`py-1 pr-3 font-medium whitespace-nowrap ${column.numeric ? "text-right" : ""}`}>
                  <button
                    type="button"
                    onClick={() => setSort(active && sort!.direction === 1 ? { key: column.key, direction: -1 } : { key: column.key, direction: 1 })}
                    className="hover:text-ink focus-visible:outline-2 focus-visible:outline-ledger"
                  >
                    {column.label}
                    <span aria-hidden="true">{active ? (sort!.direction === 1 ? " ▲" : " ▼") : ""}</span>
                  </button>
                </th>
              );
            })}
          </tr>
        </thead>
        <tbody>
          {sorted.map((row) => (
            <tr key={rowId(row)} id={rowAnchor?.(row)} className={`scroll-mt-20 border-b border-rule align-top target:bg-ledger-tint ${highlightRow?.(row) ? "bg-ledger-tint" : ""}`}>
              {columns.map((column) => (
                <td key={column.key} className={`py-1.5 pr-3 ${column.numeric ? "figures text-right whitespace-nowrap" : ""}`}>
                  {column.render ? column.render(row) : (column.value(row) ?? "")}
                </td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
