"use client";

import { useRef, type ClipboardEvent, type KeyboardEvent } from "react";
import { ESTIMATORS } from "@/lib/recheck/types";
import { MODEL_FIGURES, type ModelFigure } from "@/models/figures";

// A keyboard-first grid for a table of reported models: one row per model, Tab moves along the row, Enter
// moves down a column (adding a row at the bottom), and pasting a row of numbers copied from a PDF or a
// spreadsheet (tab- or space-separated; several lines for several models) fills the cells to the right.
// Every cell keeps the text exactly as typed: "9.20" stays "9.20".

export type ModelGridRow = { key: string; sampleKey: string; label: string; estimator: string; meanStructure: string } & Record<ModelFigure, string>;

export const FIGURE_HEADINGS: Record<ModelFigure, { short: string; long: string }> = {
  chisq: { short: "χ²", long: "chi-square (ML)" },
  df: { short: "df", long: "degrees of freedom" },
  p: { short: "p", long: "p of the model test" },
  chisqScaled: { short: "χ² sc.", long: "scaled chi-square" },
  scaling: { short: "c", long: "scaling correction factor" },
  cfi: { short: "CFI", long: "CFI" },
  tli: { short: "TLI", long: "TLI" },
  rmsea: { short: "RMSEA", long: "RMSEA" },
  rmseaLo: { short: "lo", long: "RMSEA 90% CI lower bound" },
  rmseaHi: { short: "hi", long: "RMSEA 90% CI upper bound" },
  srmr: { short: "SRMR", long: "SRMR" },
  aic: { short: "AIC", long: "AIC" },
  bic: { short: "BIC", long: "BIC" },
  loglik: { short: "LL", long: "log-likelihood" },
  loglikScaling: { short: "LL c", long: "log-likelihood scaling factor" },
  npar: { short: "q", long: "number of free parameters" },
  nObserved: { short: "p vars", long: "observed variables" },
  nFixedX: { short: "fixed x", long: "fixed exogenous variables" },
  baselineChisq: { short: "χ² base", long: "baseline chi-square" },
  baselineDf: { short: "df base", long: "baseline df" },
};

/** The columns a pasted row fills, left to right: the model's name, then its figures. */
type PasteColumn = "label" | ModelFigure;

const CELL = "w-full min-w-0 rounded-sm border bg-paper-raised px-1 py-0.5 text-xs figures focus-visible:outline-2 focus-visible:outline-ledger";

export interface ModelGridProps {
  rows: ModelGridRow[];
  samples: { key: string; label: string }[];
  /** which figure columns to show (all by default) */
  figures?: readonly ModelFigure[];
  errors: Record<string, string[]>;
  disabled?: boolean;
  onChange: (index: number, field: string, value: string) => void;
  /** fills cells from (row, column) on; rows past the end are added */
  onFill: (startRow: number, values: Partial<Record<PasteColumn, string>>[]) => void;
  onAdd: () => void;
  onRemove: (index: number) => void;
}

export function splitPastedTable(text: string): string[][] {
  return text
    .replace(/\r/g, "")
    .split("\n")
    .filter((line) => line.trim() !== "")
    .map((line) => (line.includes("\t") ? line.split("\t") : line.trim().split(/\s+/)).map((cell) => cell.trim()));
}

export function ModelGrid({ rows, samples, figures = MODEL_FIGURES, errors, disabled, onChange, onFill, onAdd, onRemove }: ModelGridProps) {
  const table = useRef<HTMLTableElement>(null);
  const columns: PasteColumn[] = ["label", ...figures];

  const focusCell = (row: number, field: string) => {
    requestAnimationFrame(() => table.current?.querySelector<HTMLInputElement>(`[name="models.${row}.${field}"]`)?.focus());
  };

  const onKeyDown = (event: KeyboardEvent<HTMLInputElement>, row: number, field: string) => {
    if (event.key !== "Enter") return;
    event.preventDefault();
    if (row === rows.length - 1) onAdd();
    focusCell(row + (event.shiftKey ? -1 : 1), field);
  };

  const onPaste = (event: ClipboardEvent<HTMLInputElement>, row: number, field: PasteColumn) => {
    const grid = splitPastedTable(event.clipboardData.getData("text/plain"));
    if (grid.length === 0 || (grid.length === 1 && grid[0].length === 1)) return; // one value: an ordinary paste
    event.preventDefault();
    const start = columns.indexOf(field);
    onFill(
      row,
      grid.map((cells) => Object.fromEntries(cells.slice(0, columns.length - start).map((cell, offset) => [columns[start + offset], cell]))),
    );
  };

  const errorFor = (row: number, field: string) => errors[`models.${row}.${field}`];

  return (
    <div className="space-y-2">
      <div className="relative overflow-x-auto rounded border border-rule">
        <table ref={table} className="w-full border-collapse text-left">
          <caption className="sr-only">Reported models, one a row; figures exactly as printed</caption>
          <thead className="bg-paper-sunk text-xxs text-ink-soft">
            <tr>
              <th scope="col" className="px-1 py-1 font-medium">#</th>
              {samples.length > 1 ? <th scope="col" className="px-1 py-1 font-medium">Sample</th> : null}
              <th scope="col" className="min-w-36 px-1 py-1 font-medium">Model</th>
              <th scope="col" className="px-1 py-1 font-medium">Estimator</th>
              {figures.map((figure) => (
                <th key={figure} scope="col" className="min-w-16 px-1 py-1 font-medium" title={FIGURE_HEADINGS[figure].long}>
                  <abbr title={FIGURE_HEADINGS[figure].long} className="no-underline">
                    {FIGURE_HEADINGS[figure].short}
                  </abbr>
                </th>
              ))}
              <th scope="col" className="px-1 py-1 font-medium"><span className="sr-only">Remove</span></th>
            </tr>
          </thead>
          <tbody>
            {rows.map((row, index) => (
              <tr key={row.key} className="border-t border-rule align-top">
                <td className="figures px-1 py-1 text-xxs text-ink-faint">{index + 1}</td>
                {samples.length > 1 ? (
                  <td className="min-w-28 px-1 py-1">
                    <select name={`models.${index}.sampleKey`} aria-label={`Model ${index + 1}: sample`} value={row.sampleKey} disabled={disabled} onChange={(event) => onChange(index, "sampleKey", event.target.value)} className={`${CELL} border-rule-strong`}>
                      {samples.map((sample) => (
                        <option key={sample.key} value={sample.key}>{sample.label}</option>
                      ))}
                    </select>
                  </td>
                ) : null}
                {(["label", "estimator", ...figures] as const).map((field) => {
                  const problem = errorFor(index, field);
                  const id = `models-${index}-${field}`;
                  const label = field === "label" ? "name" : field === "estimator" ? "estimator" : FIGURE_HEADINGS[field as ModelFigure].long;
                  return (
                    <td key={field} className="px-1 py-1">
                      {field === "estimator" ? (
                        <select id={id} name={`models.${index}.estimator`} aria-label={`Model ${index + 1}: estimator`} value={row.estimator} disabled={disabled} onChange={(event) => onChange(index, "estimator", event.target.value)} className={`${CELL} border-rule-strong`}>
                          <option value="">—</option>
                          {ESTIMATORS.map((estimator) => (
                            <option key={estimator} value={estimator}>{estimator}</option>
                          ))}
                        </select>
                      ) : (
                        <input
                          id={id}
                          name={`models.${index}.${field}`}
                          aria-label={`Model ${index + 1}: ${label}`}
                          aria-invalid={problem ? true : undefined}
                          aria-describedby={problem ? `${id}-error` : undefined}
                          value={row[field as "label" | ModelFigure]}
                          disabled={disabled}
                          inputMode={field === "label" ? "text" : "decimal"}
                          autoComplete="off"
                          spellCheck={false}
                          onChange={(event) => onChange(index, field, event.target.value)}
                          onKeyDown={(event) => onKeyDown(event, index, field)}
                          onPaste={(event) => onPaste(event, index, field as PasteColumn)}
                          className={`${CELL} ${problem ? "border-finding-error" : "border-rule-strong"}`}
                        />
                      )}
                      {problem ? (
                        <p id={`${id}-error`} className="mt-0.5 max-w-40 text-xxs text-finding-error">
                          {problem.join(" ")}
                        </p>
                      ) : null}
                    </td>
                  );
                })}
                <td className="px-1 py-1">
                  <button type="button" disabled={disabled} onClick={() => onRemove(index)} className="rounded-sm px-1 text-xs text-ink-faint hover:text-finding-error focus-visible:outline-2 focus-visible:outline-ledger" aria-label={`Remove model ${index + 1}${row.label ? ` (${row.label})` : ""}`}>
                    ✕
                  </button>
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <button type="button" disabled={disabled} onClick={onAdd} className="rounded border border-rule-strong bg-paper-raised px-2 py-1 text-xs font-medium hover:bg-paper-sunk focus-visible:outline-2 focus-visible:outline-ledger">
        Add a model
      </button>
      <p className="text-xxs text-ink-soft">Tab moves along a row, Enter down a column. Paste a row of numbers (from the paper&apos;s table) into the first cell to fill it; several lines add several models.</p>
    </div>
  );
}
