import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { env } from "@/lib/env";
import type { StoredMessage } from "@/lib/fakes/smtp-sink";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Development mail", robots: { index: false } };

async function readInbox(): Promise<StoredMessage[] | null> {
  try {
    const response = await fetch(`http://127.0.0.1:${env.FAKE_SMTP_WEB_PORT}/messages`, { cache: "no-store" });
    return response.ok ? ((await response.json()) as StoredMessage[]) : null;
  } catch {
    return null;
  }
}

/** Development only: the messages the fake SMTP server has received. Absent (404) in production. */
export default async function DevMailPage({ searchParams }: { searchParams: Promise<{ id?: string }> }) {
  if (!env.devTools) notFound();
  const [{ id }, messages] = await Promise.all([searchParams, readInbox()]);
  if (messages === null) {
    return (
      <div role="alert" className="space-y-2">
        <h1 className="text-xl font-semibold">Development mail</h1>
        <p className="text-ink-soft">The fake SMTP server is not running on port {env.FAKE_SMTP_WEB_PORT}. Start the app with <code>npm run demo</code>.</p>
      </div>
    );
  }
  const selected = messages.find((message) => String(message.id) === id) ?? messages[0];
  return (
    <div className="space-y-4">
      <header>
        <h1 className="text-xl font-semibold">Development mail</h1>
        <p className="text-ink-soft">Messages caught by the fake SMTP server ({messages.length}). Nothing here left this machine.</p>
      </header>
      {messages.length === 0 ? (
        <p className="rounded border border-rule bg-paper-raised p-4 text-ink-soft">No messages yet. Apply for an account or reset a password to see one arrive.</p>
      ) : (
        <div className="grid gap-4 md:grid-cols-[20rem_1fr]">
          <ol className="divide-y divide-rule rounded border border-rule bg-paper-raised" aria-label="Messages, newest first">
            {messages.map((message) => (
              <li key={message.id}>
                <Link
                  href={`/dev/mail?id=${message.id}`}
                  aria-current={message.id === selected?.id ? "true" : undefined}
                  className={`block px-3 py-2 text-ink hover:bg-paper-sunk hover:no-underline ${message.id === selected?.id ? "bg-ledger-tint" : ""}`}
                >
                  <span className="block truncate font-medium">{message.subject || "(no subject)"}</span>
                  <span className="block truncate text-xs text-ink-faint">
                    to {message.to.join(", ")} · {new Date(message.receivedAt).toLocaleString("en-GB")}
                  </span>
                </Link>
              </li>
            ))}
          </ol>
          {selected ? (
            <article className="space-y-3 rounded border border-rule bg-paper-raised p-4" aria-label="Selected message">
              <dl className="grid grid-cols-[5rem_1fr] gap-1 text-xs">
                <dt className="text-ink-faint">From</dt>
                <dd>{selected.from}</dd>
                <dt className="text-ink-faint">To</dt>
                <dd>{selected.to.join(", ")}</dd>
                <dt className="text-ink-faint">Subject</dt>
                <dd className="font-medium">{selected.subject}</dd>
              </dl>
              <pre className="whitespace-pre-wrap font-sans text-sm">{selected.text}</pre>
              {selected.html ? (
                <details>
                  <summary className="cursor-pointer text-xs text-ink-soft">HTML version</summary>
                  <iframe title="HTML version of the message" sandbox="" srcDoc={selected.html} className="mt-2 h-96 w-full rounded border border-rule bg-white" />
                </details>
              ) : null}
            </article>
          ) : null}
        </div>
      )}
    </div>
  );
}
