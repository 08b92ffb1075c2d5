// A rejected-rows download carries one extra last column, `error`, saying what to fix. So that the fixed
// file can be uploaded as it is, the importer drops that column before the sheet reader sees the bytes.
// Only the trailing `error` column is dropped, and only when the header names it; any other unknown
// column still reaches the reader and is refused there. Quotes, delimiters and line breaks are ASCII, so
// the scan works on bytes without decoding (a UTF-8 multi-byte sequence never contains them).
import type { ByteSource } from "@/lib/csv";

const QUOTE = 0x22;
const COMMA = 0x2c;
const SEMICOLON = 0x3b;
const LF = 0x0a;
const CR = 0x0d;

export const ERROR_COLUMN = "error";

class Bytes {
  private buffer = new Uint8Array(1024);
  length = 0;

  push(byte: number): void {
    if (this.length === this.buffer.length) {
      const larger = new Uint8Array(this.buffer.length * 2);
      larger.set(this.buffer);
      this.buffer = larger;
    }
    this.buffer[this.length++] = byte;
  }

  slice(end = this.length): Uint8Array {
    return this.buffer.slice(0, end);
  }

  clear(): void {
    this.length = 0;
  }
}

function lastCellIsError(header: Uint8Array, lastDelimiter: number): boolean {
  const text = new TextDecoder().decode(header.subarray(lastDelimiter + 1)).trim().replace(/^"|"$/g, "").trim().toLowerCase();
  return text === ERROR_COLUMN && lastDelimiter >= 0;
}

export async function* withoutErrorColumn(source: ByteSource): AsyncGenerator<Uint8Array> {
  const record = new Bytes();
  let inQuotes = false;
  let lastDelimiter = -1;
  let delimiter = -1; // unknown until the header is complete
  let headerDone = false;
  let dropping = false;
  const headerBytes: Uint8Array[] = [];
  let commas = 0;
  let semicolons = 0;
  let commaAt = -1;
  let semicolonAt = -1;

  for await (const chunk of source) {
    if (headerDone && !dropping) {
      yield chunk;
      continue;
    }
    const out = new Bytes();
    for (let i = 0; i < chunk.length; i++) {
      const byte = chunk[i];
      if (!headerDone) {
        if (byte === QUOTE) inQuotes = !inQuotes;
        if (!inQuotes && (byte === LF || byte === CR)) {
          headerDone = true;
          delimiter = semicolons > commas ? SEMICOLON : COMMA;
          lastDelimiter = delimiter === SEMICOLON ? semicolonAt : commaAt;
          dropping = lastCellIsError(record.slice(), lastDelimiter);
          if (!dropping) {
            // not a rejected-rows file: hand on everything untouched from here
            headerBytes.push(record.slice(), chunk.subarray(i));
            record.clear();
            for (const part of headerBytes) yield part;
            headerBytes.length = 0;
            break;
          }
          const header = record.slice(lastDelimiter);
          for (let k = 0; k < header.length; k++) out.push(header[k]);
          out.push(byte);
          record.clear();
          lastDelimiter = -1;
          continue;
        }
        if (!inQuotes && byte === COMMA) {
          commas++;
          commaAt = record.length;
        }
        if (!inQuotes && byte === SEMICOLON) {
          semicolons++;
          semicolonAt = record.length;
        }
        record.push(byte);
        continue;
      }
      if (byte === QUOTE) inQuotes = !inQuotes;
      if (!inQuotes && (byte === LF || byte === CR)) {
        if (record.length > 0) {
          const end = lastDelimiter >= 0 ? lastDelimiter : record.length;
          const kept = record.slice(end);
          for (let k = 0; k < kept.length; k++) out.push(kept[k]);
        }
        out.push(byte);
        record.clear();
        lastDelimiter = -1;
        continue;
      }
      if (!inQuotes && byte === delimiter) lastDelimiter = record.length;
      record.push(byte);
    }
    if (out.length > 0) yield out.slice();
  }
  if (!headerDone) {
    yield record.slice();
    return;
  }
  if (dropping && record.length > 0) yield record.slice(lastDelimiter >= 0 ? lastDelimiter : record.length);
}
