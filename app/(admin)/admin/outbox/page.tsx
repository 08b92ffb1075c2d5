import type { Metadata } from "next";
import { StatTile } from "@/components/stat-tile";
import { Pager } from "@/components/ui/pager";
import { formatCount } from "@/lib/format";
import { listUndeliveredMessages, STUCK_AFTER_ATTEMPTS, summariseOutbox } from "@/lib/mail/outbox";
import { RetryButton } from "./retry-button";

export const metadata: Metadata = { title: "Outbox" };
export const dynamic = "force-dynamic";

const PAGE_SIZE = 50;
const time = (value: Date) => value.toISOString().slice(0, 16).replace("T", " ");

export default async function OutboxPage({ searchParams }: { searchParams: Promise<{ page?: string }> }) {
  const requested = Number((await searchParams).page ?? "1");
  const page = Number.isInteger(requested) && requested > 0 ? requested : 1;
  const [summary, list] = await Promise.all([summariseOutbox(), listUndeliveredMessages({ page, pageSize: PAGE_SIZE })]);
  return (
    <div className="space-y-4">
      <header>
        <h1 className="text-xl font-semibold tracking-tight">Outbox</h1>
        <p className="max-w-3xl text-ink-soft">
          Every e-mail is queued here with the change that causes it and sent in the background; a failed send is
          retried with growing pauses (up to an hour) and never dropped. A message counts as stuck after{" "}
          {STUCK_AFTER_ATTEMPTS} failed attempts or a quarter of an hour in the queue; the last error usually says
          why (the mail server is unreachable, refuses the login, or rejects the address). Message bodies are not
          shown here: some hold password reset links.
        </p>
      </header>
      <dl className="grid grid-cols-3 gap-3 md:max-w-2xl">
        <StatTile label="Waiting" value={formatCount(summary.waiting)} detail="not yet delivered" />
        <StatTile label="Stuck" value={formatCount(summary.stuck)} detail="need a look" />
        <StatTile label="Delivered" value={formatCount(summary.deliveredLastDay)} detail="in the last 24 hours" />
      </dl>
      {list.rows.length === 0 ? (
        <p className="py-4 text-ink-soft">Nothing is waiting: every queued message has been delivered.</p>
      ) : (
        <table className="w-full border-collapse text-left">
          <caption className="sr-only">Undelivered messages, oldest first</caption>
          <thead className="border-b border-rule-strong text-xs uppercase tracking-wide text-ink-faint">
            <tr>
              <th scope="col" className="py-1.5 pr-3 font-medium">Queued</th>
              <th scope="col" className="py-1.5 pr-3 font-medium">To</th>
              <th scope="col" className="py-1.5 pr-3 font-medium">Message</th>
              <th scope="col" className="py-1.5 pr-3 font-medium">Attempts</th>
              <th scope="col" className="py-1.5 pr-3 font-medium">Last error</th>
              <th scope="col" className="py-1.5 pr-3 font-medium">Next try</th>
              <th scope="col" className="py-1.5 font-medium"><span className="sr-only">Retry</span></th>
            </tr>
          </thead>
          <tbody>
            {list.rows.map((message) => (
              <tr key={message.id} className={`border-b border-rule align-top ${message.stuck ? "bg-finding-warning-tint" : ""}`}>
                <td className="figures py-2 pr-3 whitespace-nowrap">
                  {time(message.createdAt)}
                  {message.stuck ? <span className="ml-1 rounded bg-finding-warning px-1 text-xxs font-medium text-paper-raised">stuck</span> : null}
                </td>
                <td className="py-2 pr-3">{message.to}</td>
                <td className="py-2 pr-3">
                  <span className="block">{message.subject}</span>
                  <span className="block text-xs text-ink-faint">{message.kind}</span>
                </td>
                <td className="figures py-2 pr-3">{message.attempts}</td>
                <td className="max-w-xs py-2 pr-3 break-words text-xs text-ink-soft">{message.lastError ?? "—"}</td>
                <td className="figures py-2 pr-3 whitespace-nowrap">{time(message.nextAttemptAt)}</td>
                <td className="py-2">
                  <RetryButton messageId={message.id} />
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
      <Pager page={page} pageSize={PAGE_SIZE} total={list.total} hrefFor={(next) => `/admin/outbox?page=${next}`} label="Outbox pages" />
    </div>
  );
}
