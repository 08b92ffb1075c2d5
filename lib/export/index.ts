import "server-only";
// The export library (issue 6): the comparison sheet, JSON, BibTeX and RIS of a selection of entries,
// each streamed from the database a page at a time. The search route (GET /api/export) and the
// workbench's own-drafts download call these; `scope` is required and decides what is visible.
export { streamSheetExport, entryRecord } from "./sheet";
export { streamJsonExport } from "./json";
export { papersToBibtex, papersToRis, streamBibtexExport, streamRisExport, type CitablePaper } from "./citations";
export { EXPORT_CAUTION } from "./caution";
export { type ExportScope, type ExportSelection } from "./selection";
export { exportResponse, EXPORT_CONTENT } from "./response";
