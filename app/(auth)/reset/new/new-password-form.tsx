"use client";

import Link from "next/link";
import { useActionState } from "react";
import { SubmitButton } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { Notice } from "@/components/ui/notice";
import { IDLE_STATE } from "@/lib/auth/action-state";
import { PASSWORD_RULE } from "@/lib/validation/account";
import { setPasswordFromLink } from "../../actions";

export function NewPasswordForm({ token }: { token: string }) {
  const [state, action] = useActionState(setPasswordFromLink, IDLE_STATE);
  if (state.ok) {
    return (
      <Notice tone="success" title="Your new password is set.">
        <Link href="/signin">Sign in with it</Link>.
      </Notice>
    );
  }
  const linkProblem = state.code === "bad_request" || Boolean(state.fieldErrors.token);
  return (
    <form action={action} className="space-y-4" noValidate>
      {state.message ? (
        <Notice tone="error">
          {state.message} {linkProblem ? <Link href="/reset">Ask for a new link</Link> : null}
        </Notice>
      ) : null}
      <input type="hidden" name="token" value={token} />
      <Field name="password" label="New password" type="password" required autoComplete="new-password" errors={state.fieldErrors.password} hint={PASSWORD_RULE} />
      <Field name="passwordConfirm" label="New password again" type="password" required autoComplete="new-password" errors={state.fieldErrors.passwordConfirm} />
      <SubmitButton pendingLabel="Saving…">Set the password</SubmitButton>
    </form>
  );
}
