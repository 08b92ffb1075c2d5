import { parseAuthorLines } from "@/lib/citations/csl";
import type { PaperMetadataInput } from "@/lib/validation/curation";
import type { CslName } from "@/models/paper";

// Form metadata → the Paper's columns. Pure.

export interface PaperColumns {
  doi: string | null;
  ref: string | null;
  title: string;
  authors: CslName[];
  journal: string | null;
  year: number | null;
  volume: string | null;
  issue: string | null;
  pages: string | null;
  field: string | null;
}

const orNull = (value: string) => (value.trim() === "" ? null : value.trim());

export function metadataColumns(metadata: PaperMetadataInput): PaperColumns {
  return {
    doi: orNull(metadata.doi),
    ref: orNull(metadata.ref),
    title: metadata.title.trim(),
    authors: parseAuthorLines(metadata.authors),
    journal: orNull(metadata.journal),
    year: metadata.year ? Number(metadata.year) : null,
    volume: orNull(metadata.volume),
    issue: orNull(metadata.issue),
    pages: orNull(metadata.pages),
    field: orNull(metadata.field),
  };
}

// Letters that Unicode decomposition leaves whole (Ø is not O + a combining mark).
const FOLDS: Record<string, string> = { Ø: "O", ø: "o", Æ: "Ae", æ: "ae", Œ: "Oe", œ: "oe", ß: "ss", Ł: "L", ł: "l", Đ: "D", đ: "d", Þ: "Th", þ: "th", ı: "i" };

function asciiFold(text: string): string {
  return text.normalize("NFD").replace(/[\u0300-\u036f]/g, "").replace(/[ØøÆæŒœßŁłĐđÞþı]/g, (letter) => FOLDS[letter]);
}

/** A curator key for a paper without DOI: first author's family name, year and a short random tail. */
export function makeRef(columns: Pick<PaperColumns, "authors" | "year">, random: () => number = Math.random): string {
  const family = columns.authors[0]?.family ?? columns.authors[0]?.literal ?? "paper";
  const stem = asciiFold(family).replace(/[^A-Za-z]/g, "").toLowerCase().slice(0, 24) || "paper";
  const tail = Math.floor(random() * 36 ** 4).toString(36).padStart(4, "0");
  return `${stem}${columns.year ?? ""}-${tail}`;
}
