import "server-only";
// BibTeX and RIS of the selected papers through citation-js, set up in lib/citations: each paper's CSL
// record is lib/citations' paperToCsl (stored fields over the resolved record). Papers are read and
// formatted a page at a time.
import { Op } from "sequelize";
import { writeCitations } from "@/lib/citations/cite";
import { paperToCsl } from "@/lib/citations/csl";
import { Paper } from "@/models";
import { EXPORT_CAUTION } from "./caution";
import { DEFAULT_PAGE_SIZE, selectedPaperIds, type ExportSelection } from "./selection";

export interface CitablePaper {
  id: number;
  doi: string | null;
  ref: string | null;
  title: string;
  authors: { family?: string; given?: string; literal?: string }[];
  journal: string | null;
  year: number | null;
  volume: string | null;
  issue: string | null;
  pages: string | null;
  csl: Record<string, unknown> | null;
}

function format(papers: readonly CitablePaper[], style: "bibtex" | "ris"): string {
  if (papers.length === 0) return "";
  return writeCitations(papers.map(paperToCsl), style);
}

export function papersToBibtex(papers: readonly CitablePaper[]): string {
  return format(papers, "bibtex");
}

export function papersToRis(papers: readonly CitablePaper[]): string {
  return format(papers, "ris");
}

const ATTRIBUTES = ["id", "doi", "ref", "title", "authors", "journal", "year", "volume", "issue", "pages", "csl"] as const;

async function* citablePages(selection: ExportSelection): AsyncGenerator<CitablePaper[]> {
  const ids = await selectedPaperIds(selection);
  const size = selection.pageSize ?? DEFAULT_PAGE_SIZE;
  for (let at = 0; at < ids.length; at += size) {
    const rows = await Paper.findAll({ where: { id: { [Op.in]: ids.slice(at, at + size) } }, attributes: [...ATTRIBUTES], order: [["id", "ASC"]] });
    yield rows.map((row) => row.get({ plain: true }) as CitablePaper);
  }
}

export async function* streamBibtexExport(selection: ExportSelection): AsyncGenerator<string> {
  yield `@comment{Fitledger export. ${EXPORT_CAUTION}}\n\n`;
  for await (const papers of citablePages(selection)) yield papersToBibtex(papers);
}

export async function* streamRisExport(selection: ExportSelection): AsyncGenerator<string> {
  for await (const papers of citablePages(selection)) yield papersToRis(papers);
}
