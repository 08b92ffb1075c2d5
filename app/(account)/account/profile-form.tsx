"use client";

import { useActionState } from "react";
import { SubmitButton } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { ActionMessage } from "@/components/ui/notice";
import { IDLE_STATE } from "@/lib/auth/action-state";
import { saveProfile } from "./actions";

export function ProfileForm({ name, affiliation }: { name: string; affiliation: string | null }) {
  const [state, action] = useActionState(saveProfile, IDLE_STATE);
  const values = state.values ?? { name, affiliation: affiliation ?? "" };
  return (
    <form action={action} className="max-w-md space-y-3" noValidate>
      <ActionMessage state={state} />
      <Field name="name" label="Name" required autoComplete="name" maxLength={200} defaultValue={values.name} errors={state.fieldErrors.name} />
      <Field name="affiliation" label="Affiliation" autoComplete="organization" maxLength={300} defaultValue={values.affiliation} errors={state.fieldErrors.affiliation} />
      <SubmitButton tone="secondary" pendingLabel="Saving…">
        Save profile
      </SubmitButton>
    </form>
  );
}
