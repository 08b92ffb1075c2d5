// DOI syntax and normal form (DESIGN §3: lower-case, without resolver prefix). DOI names are
// case-insensitive (DOI Handbook, chapter 2 "Numbering"; cited from memory), so lower-casing loses nothing.

const RESOLVER_PREFIX = /^(?:https?:\/\/(?:dx\.)?doi\.org\/|doi\.org\/|doi:\s*)/i;

// "10." + registrant code (digits, optionally dot-separated subdivisions) + "/" + a suffix without spaces
// (DOI Handbook, chapter 2). Crossref's stricter pattern for modern DOIs rejects some legacy suffixes, so the
// suffix is only required to be non-blank.
export const DOI_PATTERN = /^10\.\d{4,9}(?:\.\d+)*\/\S+$/;

/** The DOI in normal form, or undefined when the text is not a DOI. */
export function normaliseDoi(text: string): string | undefined {
  const doi = text.trim().replace(RESOLVER_PREFIX, "").toLowerCase();
  return DOI_PATTERN.test(doi) ? doi : undefined;
}
