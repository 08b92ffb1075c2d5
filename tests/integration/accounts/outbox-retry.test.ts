import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import type { Transporter } from "nodemailer";
import { startSmtpSink, type RunningSmtpSink } from "@/lib/fakes/smtp-sink";
import { createTestDatabase, type TestDatabase } from "../../support/test-db";

const caller = vi.hoisted(() => ({ userId: null as number | null }));
vi.mock("@/lib/auth/session", async (importOriginal) => ({
  ...(await importOriginal<typeof import("@/lib/auth/session")>()),
  readSession: async () => (caller.userId ? { userId: caller.userId } : null),
  readClientAddress: async () => "203.0.113.25",
}));
vi.mock("next/cache", () => ({ revalidatePath: () => undefined }));

const { approveApplicant } = await import("@/app/(admin)/admin/people/actions");
const { requestResetLink } = await import("@/app/(auth)/actions");
const { IDLE_STATE } = await import("@/lib/auth/action-state");
const { createMailTransport, deliverDueMessages, listUndeliveredMessages, retryDelayMs } = await import("@/lib/mail");
const { createPerson, form, outboxFor, statusOf } = await import("./support");

// The real fake SMTP server on a free port: stopped while the change is made, restarted later.
let database: TestDatabase;
let sink: RunningSmtpSink | undefined;
let smtpPort: number;
let transport: Transporter;
let admin: { id: number };
let applicant: { id: number; email: string };

beforeAll(async () => {
  database = await createTestDatabase();
  admin = await createPerson({ email: "mail.admin@fitledger.test", role: "admin" });
  applicant = await createPerson({ email: "noor.haddad@example.org", name: "Noor Haddad", status: "pending" });
  const probe = await startSmtpSink({ smtpPort: 0, webPort: 0 });
  smtpPort = probe.smtpPort;
  await probe.close();
  transport = createMailTransport({ host: "127.0.0.1", port: smtpPort, secure: false });
});
afterAll(async () => {
  transport.close();
  await sink?.close();
  await database.destroy();
});

describe("mail survives a failing SMTP server", () => {
  it("the approval succeeds while the SMTP server is down, with its e-mail queued", async () => {
    caller.userId = admin.id;
    const state = await approveApplicant(IDLE_STATE, form({ userId: applicant.id, role: "contributor" }));
    expect(state.ok).toBe(true);
    expect(await statusOf(applicant.id)).toMatchObject({ status: "active" });
    const [queued] = await outboxFor(applicant.email);
    expect(queued).toMatchObject({ kind: "account-approved", sentAt: null, attempts: 0 });
  });

  it("a send attempt against the stopped server fails, is recorded with its error and rescheduled", async () => {
    const now = new Date();
    const report = await deliverDueMessages({ transport, now });
    expect(report).toEqual({ attempted: 1, delivered: 0, failed: 1 });
    const [message] = await outboxFor(applicant.email);
    expect(message.attempts).toBe(1);
    expect(message.sentAt).toBeNull();
    expect(message.lastError).toMatch(/ECONNREFUSED|connect/i);
    expect(new Date(message.nextAttemptAt).getTime()).toBe(now.getTime() + retryDelayMs(1));
  });

  it("admins see the undelivered message with its error, without its body", async () => {
    const { rows } = await listUndeliveredMessages({ page: 1, pageSize: 10 });
    expect(rows).toHaveLength(1);
    expect(rows[0]).toMatchObject({ to: applicant.email, kind: "account-approved", attempts: 1, stuck: false });
    expect(rows[0].lastError).toBeTruthy();
    expect(rows[0]).not.toHaveProperty("text");
  });

  it("after three failures it is shown as stuck", async () => {
    let now = Date.now();
    for (const failures of [1, 2]) {
      now += retryDelayMs(failures) + 1000;
      expect((await deliverDueMessages({ transport, now: new Date(now) })).failed).toBe(1);
    }
    const { rows } = await listUndeliveredMessages({ page: 1, pageSize: 10, now: new Date(now) });
    expect(rows[0]).toMatchObject({ attempts: 3, stuck: true });
  });

  it("waits for the backoff, then delivers exactly once when the server is back", async () => {
    sink = await startSmtpSink({ smtpPort, webPort: 0 });
    expect(await deliverDueMessages({ transport })).toEqual({ attempted: 0, delivered: 0, failed: 0 });
    const [waiting] = await outboxFor(applicant.email);
    const later = new Date(new Date(waiting.nextAttemptAt).getTime() + 1);
    expect(await deliverDueMessages({ transport, now: later })).toEqual({ attempted: 1, delivered: 1, failed: 0 });
    expect(await deliverDueMessages({ transport, now: new Date(later.getTime() + 24 * 3_600_000) })).toEqual({ attempted: 0, delivered: 0, failed: 0 });

    const received = sink.messages().filter((message) => message.to.includes(applicant.email));
    expect(received).toHaveLength(1);
    expect(received[0].subject).toBe("Your Fitledger account is ready");
    expect(received[0].text).toContain("Noor Haddad");
    const [message] = await outboxFor(applicant.email);
    expect(message.sentAt).not.toBeNull();
    expect(message.attempts).toBe(4);
    expect((await listUndeliveredMessages({ page: 1, pageSize: 10 })).rows).toEqual([]);
  });

  it("a reset link reaches the inbox, and the outbox keeps no copy of it once delivered", async () => {
    await requestResetLink(IDLE_STATE, form({ email: applicant.email }));
    expect((await deliverDueMessages({ transport })).delivered).toBe(1);
    const delivered = sink!.messages().find((message) => message.subject.includes("new Fitledger password"));
    expect(delivered?.text).toMatch(/\/reset\/new\?token=/);
    const stored = (await outboxFor(applicant.email)).find((message) => message.kind === "password-reset");
    expect(stored?.sentAt).not.toBeNull();
    expect(stored?.text).not.toMatch(/token=/);
    expect(stored?.html).toBeNull();
  });
});
