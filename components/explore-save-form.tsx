"use client";

import { useSearchParams } from "next/navigation";
import { useActionState } from "react";
import { saveSearch } from "@/app/(public)/explore/actions";
import { SubmitButton } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { ActionMessage } from "@/components/ui/notice";
import { IDLE_STATE } from "@/lib/auth/action-state";

/** "Save this search" under the Explore results, for signed-in readers; the query is the page's own. */
export function ExploreSaveForm() {
  const searchParams = useSearchParams();
  const [state, action] = useActionState(saveSearch, IDLE_STATE);
  return (
    <details className="rounded border border-rule bg-paper-raised p-3">
      <summary className="cursor-pointer text-sm font-medium">Save this search</summary>
      <form action={action} className="mt-2 max-w-md space-y-2" noValidate>
        <ActionMessage state={state} />
        <input type="hidden" name="query" value={searchParams.toString()} />
        <Field name="name" label="Name" required maxLength={200} defaultValue={state.ok ? "" : state.values?.name} errors={state.fieldErrors.name ?? state.fieldErrors.query} />
        <label className="flex items-center gap-1.5 text-xs">
          <input type="checkbox" name="alerts" className="accent-ledger" defaultChecked={state.values?.alerts === "on"} />
          E-mail me once a day when newly verified comparisons match
        </label>
        <SubmitButton tone="secondary" size="small" pendingLabel="Saving…">
          Save search
        </SubmitButton>
        <p className="text-xs text-ink-soft">
          Your saved searches: <a href="/explore/saved">Saved searches</a>
        </p>
      </form>
    </details>
  );
}
