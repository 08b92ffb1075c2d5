// The downloadable files of imports/: template, codebook and example sheets of an invented scenario.
export const IMPORT_FILES = [
  { name: "comparison-sheet-template.csv", label: "Template (header row only)", type: "text/csv; charset=utf-8" },
  { name: "CODEBOOK.md", label: "Codebook: every column, its values and the printed-text rule", type: "text/markdown; charset=utf-8" },
  { name: "example-invariance-steps.csv", label: "Example: multi-group invariance steps with MLR", type: "text/csv; charset=utf-8" },
  { name: "example-several-papers.csv", label: "Example: several papers, LRT and information criteria", type: "text/csv; charset=utf-8" },
] as const;
