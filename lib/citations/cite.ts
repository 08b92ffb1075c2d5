import "server-only";
import { Cite, plugins } from "@citation-js/core";
import "@citation-js/plugin-bibtex";
import "@citation-js/plugin-ris";
import "@citation-js/plugin-csl";
import type { CslItem } from "./csl";

// citation-js, set up once for the whole server: BibTeX and RIS input, CSL output with the offline
// templates (apa, vancouver, harvard1; STACK.md). Exports and the paper page format through here.

export type CitationFormat = "bibtex" | "ris";

export type ParseOutcome = { ok: true; items: CslItem[] } | { ok: false; message: string };

const FORCE_TYPE: Record<CitationFormat, string> = { bibtex: "@biblatex/text", ris: "@ris/file" };

/** Guesses the format of pasted text: RIS starts its records with "TY  -", BibTeX with "@type{". */
export function detectCitationFormat(text: string): CitationFormat | null {
  if (/^\s*TY {2}- /m.test(text)) return "ris";
  if (/^\s*@[a-z]+\s*[{(]/im.test(text)) return "bibtex";
  return null;
}

/** Parses BibTeX or RIS into CSL-JSON records; a text that yields no record with a title is refused. */
export async function parseCitations(text: string, format?: CitationFormat): Promise<ParseOutcome> {
  const kind = format ?? detectCitationFormat(text);
  if (!kind) return { ok: false, message: "This does not look like BibTeX (an entry starts with @article{…) or RIS (a record starts with TY  - )." };
  try {
    const cite = await Cite.async(text, { forceType: FORCE_TYPE[kind] });
    const items = (cite.data as CslItem[]).filter((item) => typeof item.title === "string" && item.title.trim() !== "");
    if (items.length === 0) return { ok: false, message: `No ${kind === "bibtex" ? "BibTeX" : "RIS"} record with a title could be read from this text.` };
    return { ok: true, items };
  } catch (error) {
    const detail = error instanceof Error ? error.message.split("\n")[0].slice(0, 200) : "";
    return { ok: false, message: `The ${kind === "bibtex" ? "BibTeX" : "RIS"} text could not be read${detail ? `: ${detail}` : "."}` };
  }
}

export type CitationTemplate = "apa" | "vancouver" | "harvard1";

/** A formatted reference in plain text (citation-js CSL templates, offline). */
export function formatCitation(item: CslItem, template: CitationTemplate = "apa"): string {
  const cite = new Cite(item);
  return String(cite.format("bibliography", { format: "text", template, lang: "en-US" })).trim();
}

/** BibTeX or RIS text of records (for exports). */
export function writeCitations(items: CslItem[], format: CitationFormat): string {
  const cite = new Cite(items);
  return String(cite.format(format === "bibtex" ? "bibtex" : "ris", { format: "text" }));
}

export { plugins as citationPlugins };
