"use client";

import { useActionState } from "react";
import { SubmitButton } from "@/components/ui/button";
import { Field, TextAreaField } from "@/components/ui/field";
import { Notice } from "@/components/ui/notice";
import { IDLE_STATE } from "@/lib/auth/action-state";
import { PASSWORD_RULE } from "@/lib/validation/account";
import { submitApplication } from "../actions";

export function JoinForm() {
  const [state, action] = useActionState(submitApplication, IDLE_STATE);
  if (state.ok) {
    return (
      <Notice tone="success" title="Thank you — your application is in.">
        <ol className="mt-1 list-decimal space-y-1 pl-5">
          <li>An admin reads it, usually within a few working days.</li>
          <li>You get an e-mail at the address you gave with the decision.</li>
          <li>Once approved, sign in with the e-mail address and password you chose.</li>
        </ol>
        <p className="mt-2 text-xs">Until then the account cannot sign in. Nothing else is needed from you.</p>
      </Notice>
    );
  }
  const errors = state.fieldErrors;
  const values = state.values ?? {};
  return (
    <form action={action} className="space-y-4" noValidate>
      {state.message ? <Notice tone="error">{state.message}</Notice> : null}
      <Field name="name" label="Full name" required autoComplete="name" maxLength={200} defaultValue={values.name} errors={errors.name} />
      <Field name="email" label="E-mail address" type="email" required autoComplete="email" defaultValue={values.email} errors={errors.email} hint="Use your institutional address if you have one." />
      <Field name="affiliation" label="Affiliation" autoComplete="organization" maxLength={300} defaultValue={values.affiliation} errors={errors.affiliation} />
      <TextAreaField
        name="reason"
        label="Why would you like an account?"
        required
        rows={3}
        maxLength={2000}
        defaultValue={values.reason}
        errors={errors.reason}
        hint="A sentence or two: the literature you audit, or the project you code for."
      />
      <Field name="password" label="Password" type="password" required autoComplete="new-password" errors={errors.password} hint={PASSWORD_RULE} />
      <Field name="passwordConfirm" label="Password again" type="password" required autoComplete="new-password" errors={errors.passwordConfirm} />
      <SubmitButton pendingLabel="Sending…">Send application</SubmitButton>
    </form>
  );
}
