// CSL-JSON (Citation Style Language data) as far as Fitledger reads it, and the conversion of a CSL
// record into the Paper's own fields (DESIGN §3). Pure: safe in the browser.
import type { CslName } from "@/models/paper";
import { normaliseDoi } from "@/lib/doi/normalise";

export interface CslDate {
  "date-parts"?: (number | string)[][];
  literal?: string;
  raw?: string;
}

export interface CslItem {
  id?: string | number;
  type?: string;
  title?: string;
  author?: CslName[];
  editor?: CslName[];
  "container-title"?: string | string[];
  issued?: CslDate;
  volume?: string | number;
  issue?: string | number;
  page?: string;
  DOI?: string;
  URL?: string;
  [key: string]: unknown;
}

/** The metadata fields of a Paper, as the new-paper form and the server both read them. */
export interface PaperMetadata {
  doi: string;
  title: string;
  /** one author a line, "Family, Given" (particles kept: "van der Berg, Anna") */
  authors: string;
  journal: string;
  year: string;
  volume: string;
  issue: string;
  pages: string;
}

const text = (value: unknown): string => (value === undefined || value === null ? "" : String(Array.isArray(value) ? (value[0] ?? "") : value).trim());

/** "van der Berg, Anna" (organisations: "{Fitledger Consortium}") — the particle stays with the family name so the line reads back the same. */
export function formatName(name: CslName): string {
  // an organisation in braces, as BibTeX writes it, so it is not read back as given + family name
  if (name.literal) return `{${name.literal}}`;
  const family = [name["non-dropping-particle"], name.family].filter(Boolean).join(" ");
  const given = [name.given, name["dropping-particle"]].filter(Boolean).join(" ");
  const main = given ? `${family}, ${given}` : family;
  return name.suffix ? `${main}, ${name.suffix}` : main;
}

const PARTICLES = /^((?:(?:van|von|der|den|de|del|della|di|da|du|la|le|ten|ter|dos|das|y|zu|af|av|al|el|bin|ibn|st\.?)\s+)+)(.+)$/i;

/** Reads "Family, Given" (or "Given Family") back into a CSL name; a lower-case particle is kept apart. */
export function parseName(line: string): CslName | null {
  const value = line.trim().replace(/\s+/g, " ");
  if (!value) return null;
  const literal = /^\{(.+)\}$/.exec(value);
  if (literal) return { literal: literal[1].trim() };
  const parts = value.split(",").map((part) => part.trim());
  let family: string;
  let given: string | undefined;
  let suffix: string | undefined;
  if (parts.length >= 2) {
    [family, given] = parts;
    if (parts[2]) suffix = parts[2];
  } else {
    const words = value.split(" ");
    if (words.length === 1) return { literal: value };
    family = words.pop()!;
    // lower-case words before the family name are particles ("Ludwig van Beethoven")
    while (words.length > 1 && /^[a-z]/.test(words[words.length - 1])) family = `${words.pop()} ${family}`;
    given = words.join(" ");
  }
  const name: CslName = {};
  const particle = PARTICLES.exec(family);
  if (particle && /^[a-z]/.test(family)) {
    name["non-dropping-particle"] = particle[1].trim();
    name.family = particle[2];
  } else {
    name.family = family;
  }
  if (given) name.given = given;
  if (suffix) name.suffix = suffix;
  return name;
}

export function parseAuthorLines(lines: string): CslName[] {
  return lines
    .split(/\r?\n|;/)
    .map(parseName)
    .filter((name): name is CslName => name !== null);
}

export function yearOf(item: CslItem): string {
  const part = item.issued?.["date-parts"]?.[0]?.[0];
  if (part !== undefined && /^\d{4}$/.test(String(part))) return String(part);
  const loose = /\b(1[89]\d{2}|2[01]\d{2})\b/.exec(item.issued?.literal ?? item.issued?.raw ?? "");
  return loose ? loose[1] : "";
}

/** CSL → the form's fields: empty strings for what the record does not say. */
export function cslToMetadata(item: CslItem): PaperMetadata {
  return {
    doi: item.DOI ? (normaliseDoi(String(item.DOI)) ?? String(item.DOI).trim()) : "",
    title: text(item.title).replace(/\s+/g, " "),
    authors: (item.author ?? []).map(formatName).join("\n"),
    journal: text(item["container-title"]),
    year: yearOf(item),
    volume: text(item.volume),
    issue: text(item.issue),
    // a page range with an en dash, as printed (citation-js writes a hyphen)
    pages: text(item.page).replace(/(\d)\s*-{1,2}\s*(\d)/g, "$1–$2"),
  };
}

/**
 * The CSL record of a paper, for the paper page's reference and for BibTeX/RIS exports: its stored
 * fields win over the resolved record (kept from the DOI registry or a pasted citation), which fills the
 * rest. The id (citation-js turns it into nothing visible; exports key records by it) is the DOI, else
 * the sheet's paper reference, else the paper's number.
 */
export function paperToCsl(paper: { id: number; doi: string | null; ref?: string | null; title: string; authors: CslName[]; journal: string | null; year: number | null; volume: string | null; issue: string | null; pages: string | null; csl?: Record<string, unknown> | null }): CslItem {
  const item: CslItem = {
    ...(paper.csl ?? {}),
    id: paper.doi ?? paper.ref ?? `fitledger-${paper.id}`,
    type: typeof paper.csl?.type === "string" ? paper.csl.type : "article-journal",
    title: paper.title,
  };
  if (paper.authors.length > 0) item.author = paper.authors;
  if (paper.journal) item["container-title"] = paper.journal;
  if (paper.year !== null) item.issued = { "date-parts": [[paper.year]] };
  if (paper.volume) item.volume = paper.volume;
  if (paper.issue) item.issue = paper.issue;
  if (paper.pages) item.page = paper.pages;
  if (paper.doi) item.DOI = paper.doi;
  return item;
}
