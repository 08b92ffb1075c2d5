"use client";

import { useActionState } from "react";
import { SubmitButton } from "@/components/ui/button";
import { Field, TextAreaField } from "@/components/ui/field";
import { ActionMessage } from "@/components/ui/notice";
import { IDLE_STATE } from "@/lib/auth/action-state";
import { sendPaperCorrection } from "./actions";

export function CorrectionForm({ paperId }: { paperId: number }) {
  const [state, action] = useActionState(sendPaperCorrection, IDLE_STATE);
  const values = state.ok ? {} : (state.values ?? {});
  return (
    <form action={action} className="max-w-xl space-y-3" aria-labelledby="correction-heading">
      <input type="hidden" name="paperId" value={paperId} />
      {/* people do not see this field; programs that fill every field do */}
      <div aria-hidden="true" className="hidden">
        <label htmlFor="correction-website">Website</label>
        <input id="correction-website" name="website" tabIndex={-1} autoComplete="off" />
      </div>
      <Field name="name" id="correction-name" label="Your name" required errors={state.fieldErrors.name} defaultValue={values.name} maxLength={200} autoComplete="name" />
      <Field name="email" id="correction-email" type="email" label="Your e-mail address" required errors={state.fieldErrors.email} defaultValue={values.email} maxLength={320} autoComplete="email" hint="Only curators see it, to reply to you." />
      <TextAreaField name="message" id="correction-message" label="What should be corrected?" required rows={4} maxLength={5000} errors={state.fieldErrors.message} defaultValue={values.message} />
      <ActionMessage state={state} />
      <SubmitButton pendingLabel="Sending…">Send the correction</SubmitButton>
    </form>
  );
}
