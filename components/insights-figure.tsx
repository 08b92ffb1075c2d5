import type { ReactNode } from "react";
import { tableCsv, tableJson, type FigureTable } from "@/lib/stats/tables";

// One Insights figure: its chart, the same figures as a data table (for screen readers and for anyone
// who would rather read), and CSV/JSON downloads built from those very rows.

const dataUri = (type: string, text: string) => `data:${type};charset=utf-8,${encodeURIComponent(text)}`;

export function InsightsFigure({ table, context, chart, caption }: { table: FigureTable; context: Record<string, unknown>; chart: ReactNode; caption?: ReactNode }) {
  const headingId = `figure-${table.id}`;
  return (
    <section aria-labelledby={headingId} className="space-y-2 rounded border border-rule bg-paper-raised p-4">
      <div className="flex flex-wrap items-baseline gap-x-4 gap-y-1">
        <h2 id={headingId} className="text-sm font-semibold">
          {table.title}
        </h2>
        <div className="ml-auto flex gap-3 text-xs">
          <a href={dataUri("text/csv", tableCsv(table))} download={`fitledger-${table.id}.csv`}>
            Download CSV
          </a>
          <a href={dataUri("application/json", tableJson(table, context))} download={`fitledger-${table.id}.json`}>
            Download JSON
          </a>
        </div>
      </div>
      {caption ? <p className="text-xs text-ink-soft">{caption}</p> : null}
      {table.rows.length === 0 ? <p className="text-ink-soft">No comparisons in this selection.</p> : chart}
      {table.rows.length > 0 ? (
        <details>
          <summary className="cursor-pointer text-xs text-ledger">The figures as a table</summary>
          <div className="relative mt-2 overflow-x-auto">
            <table className="w-full border-collapse text-left text-xs">
              <caption className="sr-only">{table.title}</caption>
              <thead>
                <tr className="border-b border-rule-strong text-ink-faint">
                  {table.columns.map((column) => (
                    <th key={column.key} scope="col" className="py-1 pr-3 font-medium">
                      {column.label}
                    </th>
                  ))}
                </tr>
              </thead>
              <tbody>
                {table.rows.map((row, position) => (
                  <tr key={position} className="border-b border-rule">
                    {table.columns.map((column, at) =>
                      at === 0 ? (
                        <th key={column.key} scope="row" className="py-1 pr-3 font-normal">
                          {row[column.key] ?? "–"}
                        </th>
                      ) : (
                        <td key={column.key} className="figures py-1 pr-3">
                          {row[column.key] ?? "–"}
                        </td>
                      ),
                    )}
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        </details>
      ) : null}
    </section>
  );
}
