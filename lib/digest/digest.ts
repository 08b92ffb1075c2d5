import "server-only";
import { Op } from "sequelize";
import { db } from "@/lib/db";
import { listDueAlerts, type AlertSubscription } from "@/lib/db/queries/saved-searches";
import { appLink, queueMail, type MailKind } from "@/lib/mail";
import { compose, type MailContent } from "@/lib/mail/compose";
import { getCorpusIndex } from "@/lib/search";
import type { CorpusIndex } from "@/lib/search/corpus-index";
import { evaluate, hitAt, pageRows, type ComparisonHit } from "@/lib/search/engine";
import { findingTitle } from "@/lib/search/labels";
import { parseSearchQuery } from "@/lib/validation/search";

// The daily digest of saved searches with alerts (DESIGN §2): for each, the comparisons of papers
// verified since its last digest that match it, mailed through the outbox. A search whose owner is not
// active is skipped. Each search is claimed by moving its lastNotifiedAt in a conditional update, in the
// same transaction as the queued mail, so two app instances never send the same digest twice.

/** A digest goes out at most once in this long (a day, less an hour of slack for the hourly check). */
export const DIGEST_INTERVAL_MS = 23 * 60 * 60 * 1000;
const LISTED = 20;

const DIGEST_KIND: MailKind = "search-digest";

export function digestMail(input: { name: string; searchName: string; total: number; hits: ComparisonHit[]; exploreUrl: string; manageUrl: string; since: Date }): MailContent {
  const lines = input.hits.map((hit) => {
    const findings = hit.findings.length ? hit.findings.map((finding) => findingTitle(finding.code)).join("; ") : "no findings";
    return `• ${hit.paper.title} (${hit.paper.year ?? "n.d."}) — ${hit.label}: ${findings}\n  ${appLink(hit.href)}`;
  });
  const more = input.total > input.hits.length ? [`…and ${input.total - input.hits.length} more.`] : [];
  return compose(`${input.total} new ${input.total === 1 ? "comparison matches" : "comparisons match"} “${input.searchName}”`, [
    `Hello ${input.name},`,
    `since ${input.since.toISOString().slice(0, 16).replace("T", " ")} UTC, curators have verified ${input.total} ${input.total === 1 ? "comparison" : "comparisons"} that match your saved search “${input.searchName}”.`,
    lines.join("\n"),
    ...more,
    { link: input.exploreUrl, label: "See them all in Explore" },
    "A finding is a possible inconsistency computed from the numbers as printed and as coded; it is not evidence of misconduct.",
    { link: input.manageUrl, label: "Turn this alert off or delete the search" },
  ]);
}

export interface DigestReport {
  checked: number;
  mailed: number;
  /** searches whose stored query no longer parses (left alone, reported) */
  unreadable: number[];
}

async function digestOne(index: CorpusIndex, subscription: AlertSubscription, now: Date): Promise<"mailed" | "quiet" | "taken" | "unreadable"> {
  const parsed = parseSearchQuery(new URLSearchParams(subscription.query), { paging: true, extra: ["cols"] });
  if (!parsed.ok) return "unreadable";
  const since = subscription.lastNotifiedAt ?? subscription.createdAt;
  // the public corpus: an alert lists newly verified comparisons, whoever saved the search
  const filters = { ...parsed.value.filters, mine: false, state: [] };
  const evaluation = evaluate(index, { filters, scope: { kind: "public" }, verifiedAfter: since, verifiedBefore: now });
  const rows = pageRows(index, evaluation.matched, { page: 1, perPage: LISTED, sort: "-year" });
  const { models, sequelize } = await db();
  return sequelize.transaction(async (transaction) => {
    const [claimed] = await models.SavedSearch.update(
      { lastNotifiedAt: now },
      { where: { id: subscription.id, alerts: true, lastNotifiedAt: subscription.lastNotifiedAt === null ? { [Op.is]: null } : subscription.lastNotifiedAt }, transaction },
    );
    if (claimed === 0) return "taken";
    if (evaluation.total === 0) return "quiet";
    const content = digestMail({
      name: subscription.user.name,
      searchName: subscription.name,
      total: evaluation.total,
      hits: rows.map((row) => hitAt(index, row, evaluation.codeSet)),
      exploreUrl: appLink(`/explore${subscription.query ? `?${subscription.query}` : ""}`),
      manageUrl: appLink("/explore/saved"),
      since,
    });
    await queueMail({ to: subscription.user.email, kind: DIGEST_KIND, content }, { actorId: null, transaction });
    return "mailed";
  });
}

/** One digest round: every due alert, checked against the index of the current data. */
export async function runDigest({ now = new Date() }: { now?: Date } = {}): Promise<DigestReport> {
  const due = await listDueAlerts({ before: new Date(now.getTime() - DIGEST_INTERVAL_MS) });
  const report: DigestReport = { checked: due.length, mailed: 0, unreadable: [] };
  if (due.length === 0) return report;
  const index = await getCorpusIndex();
  for (const subscription of due) {
    const outcome = await digestOne(index, subscription, now);
    if (outcome === "mailed") report.mailed += 1;
    if (outcome === "unreadable") report.unreadable.push(subscription.id);
  }
  return report;
}
