// DOI syntax and normal form (DESIGN §3: lower-case, without resolver prefix) — the one home of both,
// imported by the Paper model, the comparison sheet and the curation forms. DOI names are
// case-insensitive (DOI Handbook, chapter 2 "Numbering"), so lower-casing loses nothing. Pure: no
// node:* imports, so forms can use it in the browser.

const RESOLVER_PREFIX = /^(?:https?:\/\/(?:dx\.)?doi\.org\/|(?:dx\.)?doi\.org\/|doi:\s*)/i;

// "10." + registrant code (digits, optionally dot-separated subdivisions) + "/" + a suffix without spaces
// (DOI Handbook, chapter 2). Crossref's stricter pattern for modern DOIs rejects some legacy suffixes, so
// the suffix is only required to be non-blank.
export const DOI_PATTERN = /^10\.\d{4,9}(?:\.\d+)*\/\S+$/;

/** The text without resolver prefix, trimmed and lower-cased, whether or not it is a DOI. */
export function stripDoi(text: string): string {
  return text.trim().replace(RESOLVER_PREFIX, "").trim().toLowerCase();
}

/** The DOI in normal form, or undefined when the text is not a DOI. */
export function normaliseDoi(text: string): string | undefined {
  const doi = stripDoi(text);
  return DOI_PATTERN.test(doi) ? doi : undefined;
}

export const DOI_HINT = "A DOI looks like 10.5555/abc-123 (a doi.org link works too).";
