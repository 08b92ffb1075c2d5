// A sheet refused as a whole: it cannot be read as a comparison sheet at all. Problems confined to one row
// are never thrown; they travel with the row (SheetRow.problems) so that the other rows still come through.

export type SheetErrorCode =
  | "empty_file"
  | "not_utf8"
  | "no_header"
  | "unknown_column"
  | "duplicate_column"
  | "missing_column"
  | "unnamed_column"
  | "record_too_long";

export class SheetError extends Error {
  readonly code: SheetErrorCode;

  constructor(code: SheetErrorCode, message: string) {
    super(message);
    this.name = "SheetError";
    this.code = code;
  }
}

export function isSheetError(error: unknown): error is SheetError {
  return error instanceof SheetError;
}
