// GET /api/imports/files/{name} — the sheet template, its codebook and the example sheets of imports/.
// Read-only and the same for everyone; only the files listed here can be fetched.
import { readFile } from "node:fs/promises";
import path from "node:path";
import { AppError } from "@/lib/errors";
import { respond } from "@/lib/http/respond";
import { IMPORT_FILES } from "@/lib/import/files";

export const runtime = "nodejs";

export async function GET(_request: Request, context: { params: Promise<Record<string, string | string[] | undefined>> }): Promise<Response> {
  return respond(async () => {
    const name = (await context.params).name;
    const file = typeof name === "string" ? IMPORT_FILES.find((entry) => entry.name === name) : undefined;
    if (!file) throw new AppError("not_found", "There is no such file among the import templates.");
    const text = await readFile(path.join(process.cwd(), "imports", file.name), "utf8");
    return new Response(text, { headers: { "Content-Type": file.type, "Content-Disposition": `attachment; filename="${file.name}"`, "Cache-Control": "public, max-age=300" } });
  });
}
