import "server-only";
// The export in the comparison-sheet format (DESIGN §5), written by lib/csv's writer (formula escape
// included), so export → import gives back every printed figure exactly.
import { sheetHeaderLine, sheetRecordLine, type SheetRecord } from "@/lib/csv";
import { modelInput, sampleInput } from "@/lib/db/flags";
import { formatAuthors } from "@/lib/import/authors";
import { COMPARISON_FIGURES, textAttribute } from "@/models/figures";
import { readExportPages, type ExportEntry } from "./read-pages";
import type { ExportSelection } from "./selection";

const orUndefined = (value: string | number | null | undefined) => (value === null || value === undefined || value === "" ? undefined : String(value));

export function entryRecord({ paper, sample, comparison, restricted, free }: ExportEntry): SheetRecord {
  const record: SheetRecord = {
    paper: {
      doi: orUndefined(paper.doi),
      paperRef: orUndefined(paper.ref),
      title: orUndefined(paper.title),
      year: orUndefined(paper.year),
      journal: orUndefined(paper.journal),
      authors: orUndefined(formatAuthors(paper.authors)),
      field: orUndefined(paper.field),
    },
    sample: sampleInput(sample),
    comparison: {
      label: comparison.label,
      method: comparison.method,
      nested: comparison.nested,
      alpha: orUndefined(comparison.alphaText),
      location: orUndefined(comparison.location),
      preferred: orUndefined(comparison.preferred),
      invarianceClaimed: orUndefined(comparison.invarianceClaimed),
      notes: orUndefined(comparison.notes),
    },
    restricted: modelInput(restricted),
    free: modelInput(free),
  };
  const fields = record.comparison as Record<string, string | undefined>;
  for (const figure of COMPARISON_FIGURES) fields[figure] = orUndefined((comparison as unknown as Record<string, string | null>)[textAttribute(figure)]);
  return record;
}

/** The selected comparisons as sheet lines (header first), read from the database a page at a time. */
export async function* streamSheetExport(selection: ExportSelection): AsyncGenerator<string> {
  yield sheetHeaderLine();
  for await (const page of readExportPages(selection)) {
    let text = "";
    for (const entry of page.entries) text += sheetRecordLine(entryRecord(entry));
    if (text) yield text;
  }
}
