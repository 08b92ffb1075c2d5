"use client";

import { useActionState } from "react";
import { SubmitButton } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { ActionMessage } from "@/components/ui/notice";
import { IDLE_STATE } from "@/lib/auth/action-state";
import { requestResetLink } from "../actions";

export function ResetRequestForm() {
  const [state, action] = useActionState(requestResetLink, IDLE_STATE);
  return (
    <form action={action} className="space-y-4" noValidate>
      <ActionMessage state={state} />
      <Field name="email" label="E-mail address" type="email" required autoComplete="email" defaultValue={state.values?.email} errors={state.fieldErrors.email} />
      <SubmitButton pendingLabel="Sending…">Send the link</SubmitButton>
    </form>
  );
}
