import { afterEach, describe, expect, it } from "vitest";
import { GET } from "@/app/api/health/route";
import { GET as unknownApi } from "@/app/api/[...path]/route";
import { createTestDatabase, type TestDatabase } from "../../support/test-db";

let database: TestDatabase | undefined;
afterEach(async () => {
  await database?.destroy().catch(() => undefined);
  database = undefined;
});

describe("GET /api/health", () => {
  it("answers ok when the database takes a query", async () => {
    database = await createTestDatabase();
    const response = await GET();
    expect(response.status).toBe(200);
    expect(await response.json()).toEqual({ status: "ok", db: "ok" });
  });

  it("answers 503 with a reason when the database is unreachable", async () => {
    database = await createTestDatabase();
    await database.sequelize.close();
    const response = await GET();
    expect(response.status).toBe(503);
    const body = await response.json();
    expect(body).toMatchObject({ status: "degraded", db: "unreachable" });
    expect(typeof body.reason).toBe("string");
  });
});

describe("an /api address without a handler", () => {
  it("answers a JSON 404 in the error shape, not an HTML page", async () => {
    const response = unknownApi(new Request("http://localhost/api/no-such-thing"));
    expect(response.status).toBe(404);
    expect(response.headers.get("content-type")).toContain("application/json");
    expect(await response.json()).toEqual({ error: { code: "not_found", message: "No API endpoint at /api/no-such-thing." } });
  });
});
