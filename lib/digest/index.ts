// lib/digest: the daily e-mail of saved searches with alerts. Import from here.
export { runDigest, digestMail, DIGEST_INTERVAL_MS, type DigestReport } from "./digest";
export { startDigestSchedule, stopDigestSchedule } from "./schedule";
