import { afterAll, beforeAll, beforeEach, describe, expect, it } from "vitest";
import { POST as applyRoute } from "@/app/api/account/apply/route";
import { POST as resetRoute } from "@/app/api/account/password-reset/route";
import { clearRateLimits } from "@/lib/auth/limits";
import { createTestDatabase, type TestDatabase } from "../../support/test-db";
import { createPerson, outboxFor, PASSWORD, signIn } from "./support";

let database: TestDatabase;
const context = { params: Promise.resolve({}) };

function post(route: typeof applyRoute, path: string, body: unknown, address: string) {
  return route(new Request(`http://fitledger.test${path}`, { method: "POST", headers: { "content-type": "application/json", "x-forwarded-for": address }, body: JSON.stringify(body) }), context);
}
const application = (email: string) => ({ name: "Rate Tester", email, reason: "Testing limits.", password: "a long enough phrase", passwordConfirm: "a long enough phrase" });

async function expect429(response: Response) {
  expect(response.status).toBe(429);
  const retryAfter = Number(response.headers.get("Retry-After"));
  expect(Number.isInteger(retryAfter) && retryAfter > 0).toBe(true);
  const body = await response.json();
  expect(body.error.code).toBe("rate_limited");
  expect(body.error.message).toMatch(/Try again in/);
  return retryAfter;
}

beforeAll(async () => {
  database = await createTestDatabase();
  await createPerson({ email: "often@example.org" });
});
beforeEach(() => clearRateLimits());
afterAll(async () => {
  await database.destroy();
});

describe("rate limits answer 429 with a JSON error and Retry-After", () => {
  it("apply: three attempts per e-mail address an hour; the fourth sends nothing", async () => {
    for (let attempt = 0; attempt < 3; attempt += 1) expect((await post(applyRoute, "/api/account/apply", application("repeat@example.org"), `198.51.100.${attempt + 1}`)).status).toBe(202);
    const mailBefore = (await outboxFor("repeat@example.org")).length;
    const retryAfter = await expect429(await post(applyRoute, "/api/account/apply", application("repeat@example.org"), "198.51.100.9"));
    expect(retryAfter).toBeLessThanOrEqual(3600);
    expect((await outboxFor("repeat@example.org")).length).toBe(mailBefore);
  });

  it("apply: ten attempts per network address an hour, whatever the e-mail", async () => {
    for (let attempt = 0; attempt < 10; attempt += 1) expect((await post(applyRoute, "/api/account/apply", application(`many${attempt}@example.org`), "198.51.100.50")).status).toBe(202);
    await expect429(await post(applyRoute, "/api/account/apply", application("many10@example.org"), "198.51.100.50"));
    expect((await post(applyRoute, "/api/account/apply", application("many11@example.org"), "198.51.100.51")).status).toBe(202);
  });

  it("reset: three requests per e-mail address an hour", async () => {
    for (let attempt = 0; attempt < 3; attempt += 1) expect((await post(resetRoute, "/api/account/password-reset", { email: "often@example.org" }, `198.51.100.${60 + attempt}`)).status).toBe(202);
    await expect429(await post(resetRoute, "/api/account/password-reset", { email: "often@example.org" }, "198.51.100.69"));
    expect((await outboxFor("often@example.org")).filter((message) => message.kind === "password-reset")).toHaveLength(3);
  });

  it("sign-in: after ten failed passwords for one address even the right password gets 429", async () => {
    for (let attempt = 0; attempt < 10; attempt += 1) expect((await signIn("often@example.org", `wrong guess number ${attempt}`, `198.51.100.${100 + attempt}`)).error).toBe("wrong-credentials");
    const blocked = await signIn("often@example.org", PASSWORD, "198.51.100.120");
    expect(blocked.status).toBe(429);
    expect(Number(blocked.headers.get("Retry-After"))).toBeGreaterThan(0);
    expect(blocked.body).toMatchObject({ error: { code: "rate_limited" } });
    expect(blocked.cookies).toEqual({});
  });

  it("sign-in: successful sign-ins are never counted", async () => {
    for (let attempt = 0; attempt < 15; attempt += 1) expect((await signIn("often@example.org", PASSWORD, "198.51.100.130")).error).toBeNull();
  });
});
