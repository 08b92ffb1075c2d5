import { escapeFormula } from "@/lib/csv/formula-escape";
import type { Prevalence, GroupPrevalence } from "./prevalence";
import type { Proportion } from "./wilson";

// The figures of each Insights chart as one table: the chart, its accessible data table and its CSV
// and JSON downloads are all drawn from the same rows, so a download holds exactly what is shown.

export interface FigureTable {
  /** file-name friendly id */
  id: string;
  title: string;
  columns: { key: string; label: string }[];
  rows: Record<string, string | number | null>[];
}

const round = (value: number | null) => (value === null ? null : Math.round(value * 10_000) / 10_000);

function proportionCells(prefix: string, value: Proportion): Record<string, number | null> {
  return { [`${prefix}k`]: value.k, [`${prefix}n`]: value.n, [`${prefix}share`]: round(value.share), [`${prefix}low`]: round(value.low), [`${prefix}high`]: round(value.high) };
}

const proportionColumns = (prefix: string, what: string) => [
  { key: `${prefix}k`, label: `${what}: k` },
  { key: `${prefix}n`, label: `${what}: n` },
  { key: `${prefix}share`, label: `${what}: share` },
  { key: `${prefix}low`, label: `${what}: Wilson 95% low` },
  { key: `${prefix}high`, label: `${what}: Wilson 95% high` },
];

export function codeTable(prevalence: Prevalence): FigureTable {
  return {
    id: "findings-per-comparison",
    title: "Share of comparisons with each finding",
    columns: [{ key: "code", label: "Finding code" }, { key: "title", label: "Finding" }, { key: "severity", label: "Severity" }, ...proportionColumns("", "Comparisons")],
    rows: prevalence.codes.filter((code) => code.comparisons.k > 0).map((code) => ({ code: code.code, title: code.title, severity: code.severity, ...proportionCells("", code.comparisons) })),
  };
}

export function groupTable(id: string, title: string, label: string, groups: GroupPrevalence[]): FigureTable {
  return {
    id,
    title,
    columns: [{ key: "value", label }, { key: "comparisons", label: "Comparisons" }, ...proportionColumns("error_", "With an error-level finding"), ...proportionColumns("paper_", "Papers with an error-level finding")],
    rows: groups.map((group) => ({ value: group.value, comparisons: group.comparisons, ...proportionCells("error_", group.withError), ...proportionCells("paper_", group.papers) })),
  };
}

export function trendTable(prevalence: Prevalence, code: string | null): FigureTable {
  if (code === null) {
    return {
      id: "error-share-by-year",
      title: "Share of comparisons with an error-level finding, by publication year",
      columns: [{ key: "year", label: "Year" }, ...proportionColumns("", "Comparisons with an error-level finding")],
      rows: prevalence.byYear.map((group) => ({ year: group.value, ...proportionCells("", group.withError) })),
    };
  }
  const trend = prevalence.trends.find((item) => item.code === code);
  return {
    id: `${code}-by-year`,
    title: `Share of comparisons with ${code}, by publication year`,
    columns: [{ key: "year", label: "Year" }, ...proportionColumns("", `Comparisons with ${code}`)],
    rows: (trend?.byYear ?? []).map((point) => ({ year: point.year, ...proportionCells("", point.share) })),
  };
}

function csvCell(value: string | number | null): string {
  if (value === null) return "";
  const text = escapeFormula(String(value));
  return /[",\n\r]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

export function tableCsv(table: FigureTable): string {
  const lines = [table.columns.map((column) => csvCell(column.label)).join(",")];
  for (const row of table.rows) lines.push(table.columns.map((column) => csvCell(row[column.key] ?? null)).join(","));
  return `${lines.join("\r\n")}\r\n`;
}

export function tableJson(table: FigureTable, context: Record<string, unknown>): string {
  return JSON.stringify({ ...context, title: table.title, columns: table.columns, rows: table.rows }, null, 2);
}
