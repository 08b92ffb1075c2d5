import "server-only";
// BibTeX and RIS of the selected papers through citation-js (@citation-js/plugin-bibtex, plugin-ris,
// plugin-csl). A paper's resolved CSL record is used when there is one; otherwise a record is built from
// its stored fields. Papers are read and formatted a page at a time.
import { Cite } from "@citation-js/core";
import "@citation-js/plugin-bibtex";
import "@citation-js/plugin-ris";
import "@citation-js/plugin-csl";
import { Op } from "sequelize";
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

/** The CSL-JSON item citation-js formats: the stored fields win over the resolved record, which fills the rest. */
export function paperCsl(paper: CitablePaper): Record<string, unknown> {
  const item: Record<string, unknown> = { ...(paper.csl ?? {}) };
  item.id = paper.doi ?? paper.ref ?? `fitledger-${paper.id}`;
  item.type = typeof item.type === "string" ? item.type : "article-journal";
  item.title = paper.title;
  if (paper.authors.length > 0) item.author = paper.authors;
  if (paper.journal) item["container-title"] = paper.journal;
  if (paper.year !== null) item.issued = { "date-parts": [[paper.year]] };
  if (paper.volume) item.volume = paper.volume;
  if (paper.issue) item.issue = paper.issue;
  if (paper.pages) item.page = paper.pages;
  if (paper.doi) item.DOI = paper.doi;
  return item;
}

function format(papers: readonly CitablePaper[], style: "bibtex" | "ris"): string {
  if (papers.length === 0) return "";
  return String(new Cite(papers.map(paperCsl)).format(style, { format: "text" }));
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
