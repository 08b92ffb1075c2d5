// lib/mail: the outbox, its sender loop and the templates. Import from here.
export { queueMail, listUndeliveredMessages, summariseOutbox, retryMessageNow, isStuck, STUCK_AFTER_ATTEMPTS, type OutgoingMail, type QueueContext, type UndeliveredMessage } from "./outbox";
export { deliverDueMessages, startMailSender, wakeMailSender, retryDelayMs, type DeliveryReport, type MailSender } from "./sender";
export { createMailTransport, smtpSettingsFromEnv, type SmtpSettings } from "./transport";
export { appLink, queueEntryReturnedMail } from "./notifications";
export { escapeHtml, type MailContent } from "./compose";
export type { MailKind } from "./templates";
