import type { HistoryEvent } from "@/lib/db/queries/papers";

// A paper's audit trail in words: each coding save lists what it changed, field by field.

const ACTION_WORDS: Record<string, string> = {
  create: "created the entry",
  "coding-saved": "saved the coding",
  recheck: "recheck",
  submit: "submitted for verification",
  return: "returned it with a comment",
  verify: "verified it",
  disposition: "recorded a verdict",
  update: "changed the entry",
  seed: "demo data",
};

const HIDDEN_FIELDS = new Set(["updatedAt", "createdAt", "curatorComment", "verifiedBy", "submittedAt", "verifiedAt"]);

const ENTITY_WORDS: Record<string, string> = { Paper: "paper", Sample: "sample", FitModel: "model", Comparison: "comparison" };

interface Change {
  entity: string;
  label: string;
  action: string;
  fields?: Record<string, [unknown, unknown]>;
}

const shown = (value: unknown) => (value === null || value === undefined || value === "" ? "blank" : typeof value === "object" ? JSON.stringify(value).slice(0, 80) : String(value));

function describe(event: HistoryEvent): string | null {
  if (event.action === "recheck") {
    const after = event.after as { flags?: number; engineVersion?: string } | null;
    return `rechecked: ${after?.flags ?? 0} finding${after?.flags === 1 ? "" : "s"} (engine ${after?.engineVersion ?? "?"})`;
  }
  if (event.action === "return") return `returned it: “${String((event.after as { curatorComment?: string } | null)?.curatorComment ?? "")}”`;
  if (event.action === "disposition") {
    const after = event.after as { code?: string; verdict?: string } | null;
    return `recorded the verdict “${after?.verdict ?? ""}” on ${after?.code ?? "a finding"}`;
  }
  return ACTION_WORDS[event.action] ?? event.action;
}

export function PaperHistory({ events, title = "History of this entry" }: { events: HistoryEvent[]; title?: string }) {
  return (
    <section aria-labelledby="paper-history" className="space-y-2">
      <h2 id="paper-history" className="text-sm font-semibold">
        {title}
      </h2>
      {events.length === 0 ? (
        <p className="text-sm text-ink-soft">No changes recorded.</p>
      ) : (
        <ol className="space-y-1.5 text-sm">
          {events.map((event) => {
            const changes = ((event.after as { changes?: Change[] } | null)?.changes ?? []) as Change[];
            // a step or a metadata update carries the changed fields themselves, before and after
            const fields = ["update", "submit", "return", "verify"].includes(event.action) && event.after ? Object.entries(event.after).filter(([field]) => !HIDDEN_FIELDS.has(field)) : [];
            return (
              <li key={event.id} className="border-l-2 border-rule pl-2">
                <span className="figures text-xs text-ink-faint">{event.at.slice(0, 16).replace("T", " ")}</span>{" "}
                <span className="font-medium">{event.actorName ?? "Fitledger"}</span> {describe(event)}
                {fields.length > 0 ? (
                  <p className="text-xs text-ink-soft">
                    {fields.map(([field, after]) => `${field} ${shown(event.before?.[field])} → ${shown(after)}`).join("; ")}
                  </p>
                ) : null}
                {changes.length > 0 ? (
                  <ul className="mt-0.5 text-xs text-ink-soft">
                    {changes.slice(0, 40).map((change, index) => (
                      <li key={index}>
                        {change.action} {ENTITY_WORDS[change.entity] ?? change.entity} “{change.label}”
                        {change.fields
                          ? `: ${Object.entries(change.fields)
                              .filter(([field]) => !change.fields![`${field}Text`]) // the parsed number repeats its printed text
                              .map(([field, [before, after]]) => `${field.replace(/Text$/, "")} ${shown(before)} → ${shown(after)}`)
                              .join("; ")}`
                          : ""}
                      </li>
                    ))}
                  </ul>
                ) : null}
              </li>
            );
          })}
        </ol>
      )}
    </section>
  );
}
