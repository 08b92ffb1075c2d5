"use client";

import { useActionState } from "react";
import { SubmitButton } from "@/components/ui/button";
import { TextAreaField } from "@/components/ui/field";
import { ActionMessage } from "@/components/ui/notice";
import { IDLE_STATE } from "@/lib/auth/action-state";
import { VERDICT_LABELS, VERDICTS } from "@/lib/validation/curation";
import { recordFindingVerdict, returnPaperEntry, verifyPaperEntry } from "../actions";

export function VerifyForm({ paperId }: { paperId: number }) {
  const [state, action] = useActionState(verifyPaperEntry, IDLE_STATE);
  return (
    <form action={action} className="space-y-2">
      <input type="hidden" name="paperId" value={paperId} />
      <ActionMessage state={state} />
      {state.ok ? null : <SubmitButton pendingLabel="Verifying…">Verify this entry</SubmitButton>}
    </form>
  );
}

const RETURN_HINT = "Say what to check or change, and where in the paper. The contributor is e-mailed this comment.";

/** Returns a submitted entry — or a verified one, for a correction — to its coder with a comment. */
export function ReturnForm({ paperId, hint = RETURN_HINT, button = "Return with this comment" }: { paperId: number; hint?: string; button?: string }) {
  const [state, action] = useActionState(returnPaperEntry, IDLE_STATE);
  return (
    <form action={action} className="space-y-2">
      <input type="hidden" name="paperId" value={paperId} />
      <TextAreaField name="comment" id="return-comment" label="Comment for the contributor" required rows={3} maxLength={5000} errors={state.fieldErrors.comment} defaultValue={state.ok ? "" : state.values?.comment} hint={hint} />
      <ActionMessage state={state} />
      {state.ok ? null : (
        <SubmitButton tone="secondary" pendingLabel="Returning…">
          {button}
        </SubmitButton>
      )}
    </form>
  );
}

export function DispositionForm({ paperId, flagId, current }: { paperId: number; flagId: number; current: { verdict: string; note: string | null; link: string | null } | null }) {
  const [state, action] = useActionState(recordFindingVerdict, IDLE_STATE);
  const values = state.ok ? {} : (state.values ?? {});
  const id = (field: string) => `verdict-${flagId}-${field}`;
  return (
    <form action={action} className="mt-2 grid gap-2 border-t border-rule pt-2 md:grid-cols-[14rem_1fr_1fr_auto]" aria-label="Curator's verdict on this finding">
      <input type="hidden" name="paperId" value={paperId} />
      <input type="hidden" name="flagId" value={flagId} />
      <div>
        <label htmlFor={id("verdict")} className="block text-xxs font-medium">Verdict</label>
        <select id={id("verdict")} name="verdict" defaultValue={values.verdict ?? current?.verdict ?? ""} aria-describedby={state.fieldErrors.verdict ? id("verdict-error") : undefined} className="w-full rounded-sm border border-rule-strong bg-paper-raised px-1 py-1 text-xs">
          <option value="">— choose —</option>
          {VERDICTS.map((verdict) => (
            <option key={verdict} value={verdict}>{VERDICT_LABELS[verdict]}</option>
          ))}
        </select>
        {state.fieldErrors.verdict ? <p id={id("verdict-error")} className="text-xxs text-finding-error">{state.fieldErrors.verdict.join(" ")}</p> : null}
      </div>
      <div>
        <label htmlFor={id("note")} className="block text-xxs font-medium">Note</label>
        <input id={id("note")} name="note" defaultValue={values.note ?? current?.note ?? ""} maxLength={5000} className="w-full rounded-sm border border-rule-strong bg-paper-raised px-1 py-1 text-xs" />
      </div>
      <div>
        <label htmlFor={id("link")} className="block text-xxs font-medium">Link (erratum, author reply)</label>
        <input id={id("link")} name="link" type="url" defaultValue={values.link ?? current?.link ?? ""} maxLength={1000} aria-invalid={state.fieldErrors.link ? true : undefined} aria-describedby={state.fieldErrors.link ? id("link-error") : undefined} className="w-full rounded-sm border border-rule-strong bg-paper-raised px-1 py-1 text-xs" />
        {state.fieldErrors.link ? <p id={id("link-error")} className="text-xxs text-finding-error">{state.fieldErrors.link.join(" ")}</p> : null}
      </div>
      <div className="flex items-end">
        <SubmitButton size="small" tone="secondary" pendingLabel="Saving…">Record</SubmitButton>
      </div>
      <div className="md:col-span-4">
        <ActionMessage state={state} />
      </div>
    </form>
  );
}
