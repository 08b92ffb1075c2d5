import "server-only";
// The JSON export: one object per comparison with its paper, sample, both models as printed, the
// engine's flags and each flag's curator verdict, who coded and who verified, and the §9 caution first.
import { ENGINE_VERSION } from "@/lib/recheck";
import { EXPORT_CAUTION } from "./caution";
import { readExportPages, type ExportPage } from "./read-pages";
import type { ExportSelection } from "./selection";
import { entryRecord } from "./sheet";

function entryObject(page: ExportPage, index: number) {
  const entry = page.entries[index];
  const record = entryRecord(entry);
  const { paper } = entry;
  return {
    paper: {
      id: paper.id,
      doi: paper.doi,
      ref: paper.ref,
      title: paper.title,
      authors: paper.authors,
      journal: paper.journal,
      year: paper.year,
      volume: paper.volume,
      issue: paper.issue,
      pages: paper.pages,
      field: paper.field,
      state: paper.state,
      codedBy: page.people.get(paper.createdBy) ?? null,
      verifiedBy: paper.verifiedBy ? (page.people.get(paper.verifiedBy) ?? null) : null,
    },
    sample: record.sample,
    comparison: record.comparison,
    restricted: record.restricted,
    free: record.free,
    flags: page.flags.get(entry.comparison.id) ?? [],
  };
}

/** `{"caution", "engineVersion", "comparisons": [...]}`, streamed a page at a time. */
export async function* streamJsonExport(selection: ExportSelection): AsyncGenerator<string> {
  yield `{"caution":${JSON.stringify(EXPORT_CAUTION)},"engineVersion":${JSON.stringify(ENGINE_VERSION)},"comparisons":[`;
  let first = true;
  for await (const page of readExportPages(selection, { withFlags: true })) {
    let text = "";
    for (let i = 0; i < page.entries.length; i++) {
      text += (first ? "\n" : ",\n") + JSON.stringify(entryObject(page, i));
      first = false;
    }
    if (text) yield text;
  }
  yield "\n]}\n";
}
