"use client";

import { useActionState } from "react";
import { SubmitButton } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { ActionMessage } from "@/components/ui/notice";
import { IDLE_STATE } from "@/lib/auth/action-state";
import { PASSWORD_RULE } from "@/lib/validation/account";
import { changeOwnPassword } from "./actions";

export function PasswordForm() {
  const [state, action] = useActionState(changeOwnPassword, IDLE_STATE);
  return (
    <form action={action} className="max-w-md space-y-3" noValidate>
      <ActionMessage state={state} />
      <Field name="currentPassword" label="Current password" type="password" required autoComplete="current-password" errors={state.fieldErrors.currentPassword} />
      <Field name="newPassword" label="New password" type="password" required autoComplete="new-password" errors={state.fieldErrors.newPassword} hint={PASSWORD_RULE} />
      <Field name="newPasswordConfirm" label="New password again" type="password" required autoComplete="new-password" errors={state.fieldErrors.newPasswordConfirm} />
      <SubmitButton tone="secondary" pendingLabel="Changing…">
        Change password
      </SubmitButton>
    </form>
  );
}
