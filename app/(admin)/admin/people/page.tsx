import type { Metadata } from "next";
import Link from "next/link";
import { Pager } from "@/components/ui/pager";
import { getCurrentUser } from "@/lib/auth/current-user";
import { ROLE_LABELS, STATUS_LABELS, STATUS_ORDER, type AccountStatus } from "@/lib/auth/roles";
import { countPeopleByStatus, listPeople, type PersonRow } from "@/lib/db/queries/users";
import { PEOPLE_PAGE_SIZE, peopleQuerySchema } from "@/lib/validation/account";
import { PersonActions } from "./person-actions";

export const metadata: Metadata = { title: "People" };
export const dynamic = "force-dynamic";

function hrefFor(status: AccountStatus, q: string, page = 1): string {
  const params = new URLSearchParams({ status });
  if (q) params.set("q", q);
  if (page > 1) params.set("page", String(page));
  return `/admin/people?${params}`;
}

const day = (value: Date) => value.toISOString().slice(0, 10);

function Details({ person }: { person: PersonRow }) {
  if (person.status === "pending") return <p className="whitespace-pre-line text-ink-soft">{person.reason ?? "—"}</p>;
  if (person.statusNote) return <p className="whitespace-pre-line text-ink-soft">{person.statusNote}</p>;
  return <span className="text-ink-faint">—</span>;
}

export default async function PeoplePage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const query = peopleQuerySchema.parse(await searchParams);
  const [me, counts, list] = await Promise.all([
    getCurrentUser(),
    countPeopleByStatus(),
    listPeople({ status: query.status, search: query.q, page: query.page, pageSize: PEOPLE_PAGE_SIZE }),
  ]);
  return (
    <div className="space-y-4">
      <header className="flex flex-wrap items-end justify-between gap-3">
        <div>
          <h1 className="text-xl font-semibold tracking-tight">People</h1>
          <p className="text-ink-soft">Applications to review and the accounts of everyone who codes, verifies or runs Fitledger.</p>
        </div>
        <form method="get" action="/admin/people" role="search" className="flex items-end gap-2">
          <input type="hidden" name="status" value={query.status} />
          <div>
            <label htmlFor="people-search" className="block text-xs font-medium">
              Search name, e-mail or affiliation
            </label>
            <input id="people-search" name="q" type="search" defaultValue={query.q} maxLength={200} className="w-64 rounded border border-rule-strong bg-paper-raised px-2.5 py-1.5" />
          </div>
          <button type="submit" className="rounded border border-rule-strong bg-paper-raised px-3 py-1.5 hover:bg-paper-sunk">
            Search
          </button>
        </form>
      </header>

      <nav aria-label="Account status">
        <ul className="flex flex-wrap gap-1 border-b border-rule">
          {STATUS_ORDER.map((status) => {
            const current = status === query.status;
            return (
              <li key={status}>
                <Link
                  href={hrefFor(status, query.q)}
                  aria-current={current ? "page" : undefined}
                  className={`-mb-px inline-block border-b-2 px-3 py-1.5 hover:no-underline ${current ? "border-ledger font-medium text-ink" : "border-transparent text-ink-soft hover:text-ink"}`}
                >
                  {STATUS_LABELS[status]} <span className="figures text-ink-faint">{counts[status]}</span>
                </Link>
              </li>
            );
          })}
        </ul>
      </nav>

      {list.rows.length === 0 ? (
        <p className="py-6 text-ink-soft">{query.q ? `No ${STATUS_LABELS[query.status].toLowerCase()} account matches “${query.q}”.` : `No account is ${STATUS_LABELS[query.status].toLowerCase()} at present.`}</p>
      ) : (
        <table className="w-full border-collapse text-left">
          <caption className="sr-only">{STATUS_LABELS[query.status]} accounts</caption>
          <thead className="border-b border-rule-strong text-xs uppercase tracking-wide text-ink-faint">
            <tr>
              <th scope="col" className="py-1.5 pr-3 font-medium">Person</th>
              <th scope="col" className="py-1.5 pr-3 font-medium">Role</th>
              <th scope="col" className="py-1.5 pr-3 font-medium">{query.status === "pending" ? "Applied" : "Since"}</th>
              <th scope="col" className="py-1.5 pr-3 font-medium">{query.status === "pending" ? "Reason" : "Note"}</th>
              <th scope="col" className="py-1.5 font-medium">Actions</th>
            </tr>
          </thead>
          <tbody>
            {list.rows.map((person) => (
              <tr key={person.id} className="border-b border-rule align-top">
                <th scope="row" className="py-2 pr-3 font-normal">
                  <span className="block font-medium text-ink">{person.name}</span>
                  <span className="block text-ink-soft">{person.email}</span>
                  {person.affiliation ? <span className="block text-xs text-ink-faint">{person.affiliation}</span> : null}
                </th>
                <td className="py-2 pr-3">{ROLE_LABELS[person.role]}</td>
                <td className="figures py-2 pr-3 whitespace-nowrap">{day(query.status === "pending" ? person.createdAt : person.updatedAt)}</td>
                <td className="max-w-xs py-2 pr-3 break-words">
                  <Details person={person} />
                </td>
                <td className="py-2">
                  <PersonActions person={{ id: person.id, name: person.name, role: person.role, status: person.status }} isSelf={person.id === me?.id} />
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
      <Pager page={query.page} pageSize={PEOPLE_PAGE_SIZE} total={list.total} hrefFor={(page) => hrefFor(query.status, query.q, page)} label="People pages" />
    </div>
  );
}
