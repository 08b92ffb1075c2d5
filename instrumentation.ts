// Runs once when a server process starts. The outbox's sender loop lives in the Node.js server process
// (never in the edge runtime, which has neither SQLite nor SMTP), so it starts only there.
export async function register() {
  // NEXT_RUNTIME is set by Next itself and replaced at build time, which keeps the Node-only imports
  // out of any edge bundle; it is not a setting, so it is not read through lib/env.ts.
  // eslint-disable-next-line no-restricted-properties
  if (process.env.NEXT_RUNTIME !== "nodejs") return;
  const { startMailSender } = await import("@/lib/mail/sender");
  startMailSender();
  const { startDigestSchedule } = await import("@/lib/digest/schedule");
  startDigestSchedule();
}
