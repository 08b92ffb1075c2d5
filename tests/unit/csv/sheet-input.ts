// Helpers for the sheet tests: text or bytes in, rows (or the refusal) out, in chunks of any size so
// that every test can also show the streaming reader agrees with itself across chunk boundaries.
import { expect } from "vitest";
import { SheetError, readSheet, type SheetRow } from "@/lib/csv";

/** The smallest header the catalogue accepts. */
export const MINIMAL_HEADER = "doi,comparison,method,a_label,b_label";

export function utf8(text: string): Uint8Array {
  return new TextEncoder().encode(text);
}

export function inChunks(data: Uint8Array, size: number): Uint8Array[] {
  const parts: Uint8Array[] = [];
  for (let i = 0; i < data.length; i += size) parts.push(data.subarray(i, i + size));
  return parts;
}

export async function readAll(input: string | Uint8Array, chunkSize = 1 << 16): Promise<SheetRow[]> {
  const data = typeof input === "string" ? utf8(input) : input;
  const rows: SheetRow[] = [];
  for await (const row of readSheet(inChunks(data, chunkSize))) rows.push(row);
  return rows;
}

export async function refusal(input: string | Uint8Array, chunkSize = 1 << 16): Promise<SheetError> {
  try {
    await readAll(input, chunkSize);
  } catch (error) {
    expect(error).toBeInstanceOf(SheetError);
    return error as SheetError;
  }
  throw new Error("the sheet was read although it should have been refused");
}
