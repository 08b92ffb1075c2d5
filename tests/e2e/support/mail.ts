import type { StoredMessage } from "@/lib/fakes/smtp-sink";

export async function listMessages(mailUrl: string): Promise<StoredMessage[]> {
  const response = await fetch(`${mailUrl}/messages`);
  if (!response.ok) throw new Error(`the fake SMTP inbox answered ${response.status}`);
  return (await response.json()) as StoredMessage[];
}

/** Polls the fake SMTP server's inbox until a message to `to` whose subject (and text) contain `subject` (and `contains`) arrives. */
export async function waitForMessage(
  mailUrl: string,
  match: { to: string; subject?: string; contains?: string },
  timeoutMs = 20_000,
): Promise<StoredMessage> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const found = (await listMessages(mailUrl)).find(
      (message) => message.to.includes(match.to.toLowerCase()) && (!match.subject || message.subject.includes(match.subject)) && (!match.contains || message.text.includes(match.contains)),
    );
    if (found) return found;
    if (Date.now() > deadline) throw new Error(`no message to ${match.to}${match.subject ? ` about "${match.subject}"` : ""} within ${timeoutMs} ms`);
    await new Promise((resolve) => setTimeout(resolve, 250));
  }
}
