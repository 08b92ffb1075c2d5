// Utf8ChunkDecoder decodes each chunk whole and carries a cut-off character over itself. It must give,
// chunk for chunk, what TextDecoder's own streaming mode gives (the platform's reading of UTF-8, and
// what this class used before), and refuse bad bytes at the same chunk with the same message.
import { describe, expect, it } from "vitest";
import { SheetError } from "@/lib/csv";
import { Utf8ChunkDecoder, firstInvalidUtf8 } from "@/lib/csv/decode-utf8";
import { mulberry32 as random } from "@/tests/support/mulberry32";

/**
 * The reference: TextDecoder in streaming mode for the text; for a refusal, the byte that the WHATWG
 * decoder stops at, found by firstInvalidUtf8 over all bytes so far (its own tests are the read-sheet ones).
 */
function reference(chunks: Uint8Array[]): { texts: string[]; error?: string } {
  const decoder = new TextDecoder("utf-8", { fatal: true });
  const texts: string[] = [];
  const seen: number[] = [];
  for (const chunk of chunks) {
    seen.push(...chunk);
    try {
      texts.push(decoder.decode(chunk, { stream: true }));
    } catch {
      const at = firstInvalidUtf8(Uint8Array.from(seen));
      return { texts, error: `not UTF-8 text (byte 0x${seen[at].toString(16).toUpperCase().padStart(2, "0")} at offset ${at}; ${seen[at] >= 0x80 && seen[at] <= 0x9f ? "Windows-1252?" : "Latin-1?"})` };
    }
  }
  try {
    texts.push(decoder.decode());
  } catch {
    let start = seen.length - 1;
    while (seen[start] >= 0x80 && seen[start] < 0xc0) start--;
    return { texts, error: `not UTF-8 text (the file ends inside a character that starts at offset ${start})` };
  }
  return { texts };
}

function decoded(chunks: Uint8Array[]): { texts: string[]; error?: string } {
  const decoder = new Utf8ChunkDecoder();
  const texts: string[] = [];
  try {
    for (const chunk of chunks) texts.push(decoder.decode(chunk));
    texts.push(decoder.end());
  } catch (error) {
    expect(error).toBeInstanceOf(SheetError);
    return { texts, error: (error as SheetError).message };
  }
  return { texts };
}

/** Text made of pieces: ASCII, 2-, 3- and 4-byte characters, byte order marks, and (rarely) bad bytes. */
function someBytes(next: () => number, bad: boolean): Uint8Array {
  const pieces = ["a", "9,", "\n", "é", "χ²", "Δ−", "€", "😀", "\ufeff", "\u07ff", "\u0800", "\uffff"];
  const bytes: number[] = [];
  if (next() < 0.2) bytes.push(0xef, 0xbb, 0xbf);
  for (let i = Math.floor(next() * 40); i > 0; i--) bytes.push(...new TextEncoder().encode(pieces[Math.floor(next() * pieces.length)]));
  if (bad) {
    const slips = [[0xe9], [0x96], [0xc3], [0xe0, 0x80], [0xed, 0xa0, 0x80], [0xf4, 0x90], [0xf0, 0x9f, 0x98], [0xc0, 0xaf], [0xff], [0xbf]];
    bytes.splice(Math.floor(next() * (bytes.length + 1)), 0, ...slips[Math.floor(next() * slips.length)]);
  }
  return Uint8Array.from(bytes);
}

function inRandomChunks(next: () => number, bytes: Uint8Array): Uint8Array[] {
  const chunks: Uint8Array[] = [];
  for (let at = 0; at < bytes.length; ) {
    const size = 1 + Math.floor(next() * 8);
    chunks.push(bytes.subarray(at, at + size));
    at += size;
  }
  return chunks;
}

describe("Utf8ChunkDecoder", () => {
  it("gives chunk for chunk the text of TextDecoder's streaming mode, and refuses at the same chunk with the same message", () => {
    const next = random(2026);
    let refused = 0;
    for (let i = 0; i < 20_000; i++) {
      const bytes = someBytes(next, next() < 0.3);
      const chunks = inRandomChunks(next, bytes);
      const expected = reference(chunks);
      expect(decoded(chunks), JSON.stringify([...bytes])).toEqual(expected);
      if (expected.error) refused++;
    }
    expect(refused).toBeGreaterThan(3000);
  }, 60_000);

  it("drops a byte order mark only at the very start, also when it arrives a byte at a time", () => {
    const bytes = Uint8Array.from([0xef, 0xbb, 0xbf, 0x61, 0xef, 0xbb, 0xbf, 0x62]);
    expect(decoded(inRandomChunks(() => 0, bytes)).texts.join("")).toBe("a\ufeffb");
    expect(decoded([bytes]).texts.join("")).toBe("a\ufeffb");
  });
});
