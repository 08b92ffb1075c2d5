// POST /api/recheck (DESIGN §6): rechecks one comparison sent as JSON and answers the engine's result.
// Public and stateless: it reads nothing from and writes nothing to the database, so it needs no session.
import { AppError, type FieldErrors } from "@/lib/errors";
import { respond } from "@/lib/http/respond";
import { recheck } from "@/lib/recheck";
import { parseRecheckBody } from "@/lib/validation/recheck";

export const runtime = "nodejs";

/** One comparison is a few hundred bytes; 64 KB leaves room for long labels and notes, and no more. */
const MAX_BODY_BYTES = 64 * 1024;

function isJson(contentType: string | null): boolean {
  const type = contentType?.split(";")[0].trim().toLowerCase() ?? "";
  return type === "application/json" || (type.startsWith("application/") && type.endsWith("+json"));
}

function tooLarge(): AppError {
  return new AppError("payload_too_large", `The body is larger than ${MAX_BODY_BYTES / 1024} KB; send one comparison per request.`);
}

/** Reads the body as UTF-8 text, stopping as soon as it passes the limit (Content-Length may be absent or wrong). */
async function readBody(request: Request): Promise<string> {
  const declared = Number(request.headers.get("content-length"));
  if (Number.isFinite(declared) && declared > MAX_BODY_BYTES) throw tooLarge();
  if (!request.body) return "";
  const reader = request.body.getReader();
  const decoder = new TextDecoder();
  let received = 0;
  let text = "";
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    received += value.byteLength;
    if (received > MAX_BODY_BYTES) {
      await reader.cancel();
      throw tooLarge();
    }
    text += decoder.decode(value, { stream: true });
  }
  return text + decoder.decode();
}

export async function POST(request: Request): Promise<Response> {
  return respond(async () => {
    if (!isJson(request.headers.get("content-type"))) {
      throw new AppError("unsupported_media_type", "Send the comparison as JSON (Content-Type: application/json).");
    }
    const text = await readBody(request);
    let body: unknown;
    try {
      body = JSON.parse(text);
    } catch {
      throw new AppError("bad_request", "The body is not valid JSON.");
    }

    const parsed = parseRecheckBody(body);
    if (!parsed.ok) throw new AppError("validation_failed", parsed.message, { fields: parsed.fields });

    const outcome = recheck(parsed.input);
    if (!outcome.ok) {
      const fields: FieldErrors = {};
      for (const error of outcome.errors) (fields[error.column] ??= []).push(error.message);
      throw new AppError("validation_failed", "Some figures could not be read.", { fields });
    }
    return Response.json(outcome.result);
  });
}
