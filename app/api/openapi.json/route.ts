// GET /api/openapi.json: the OpenAPI 3.1 description of the public API (lib/search/openapi.ts).
import { env } from "@/lib/env";
import { openApiDocument } from "@/lib/search/openapi";

export const dynamic = "force-dynamic";

export async function GET(): Promise<Response> {
  return Response.json(openApiDocument(env.APP_URL), { headers: { "cache-control": "public, max-age=300" } });
}
