import "server-only";
// A streamed download: the generator's text is encoded as it is pulled, so the response keeps to the
// reader's pace (backpressure) and nothing is built up in memory.
import type { ExportFormat } from "@/lib/validation/import";
import { streamBibtexExport, streamRisExport } from "./citations";
import { streamJsonExport } from "./json";
import type { ExportSelection } from "./selection";
import { streamSheetExport } from "./sheet";
import { EXPORT_CAUTION } from "./caution";

export const EXPORT_CONTENT: Record<ExportFormat, { type: string; extension: string; stream: (selection: ExportSelection) => AsyncGenerator<string> }> = {
  csv: { type: "text/csv; charset=utf-8", extension: "csv", stream: streamSheetExport },
  json: { type: "application/json; charset=utf-8", extension: "json", stream: streamJsonExport },
  bibtex: { type: "application/x-bibtex; charset=utf-8", extension: "bib", stream: streamBibtexExport },
  ris: { type: "application/x-research-info-systems; charset=utf-8", extension: "ris", stream: streamRisExport },
};

export function textStream(lines: AsyncGenerator<string>): ReadableStream<Uint8Array> {
  const encoder = new TextEncoder();
  return new ReadableStream<Uint8Array>({
    async pull(controller) {
      try {
        const { value, done } = await lines.next();
        if (done) controller.close();
        else controller.enqueue(encoder.encode(value));
      } catch (error) {
        console.error("[export] stream failed", error);
        controller.error(error);
      }
    },
    async cancel() {
      await lines.return(undefined);
    },
  });
}

export function exportResponse(format: ExportFormat, selection: ExportSelection, baseName: string): Response {
  const content = EXPORT_CONTENT[format];
  return new Response(textStream(content.stream(selection)), {
    headers: {
      "Content-Type": content.type,
      "Content-Disposition": `attachment; filename="${baseName}.${content.extension}"`,
      "Cache-Control": "no-store",
      // the sheet format has no room for a note; the caution travels with the download (DESIGN §9)
      "X-Fitledger-Caution": EXPORT_CAUTION,
    },
  });
}
