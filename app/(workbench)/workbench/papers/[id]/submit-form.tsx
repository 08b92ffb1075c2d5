"use client";

import { useActionState } from "react";
import { SubmitButton } from "@/components/ui/button";
import { ActionMessage } from "@/components/ui/notice";
import { IDLE_STATE } from "@/lib/auth/action-state";
import { submitForVerification } from "../../actions";

export function SubmitEntryForm({ paperId, version, label, disabled }: { paperId: number; version: number; label: string; disabled?: boolean }) {
  const [state, action] = useActionState(submitForVerification, IDLE_STATE);
  return (
    <form action={action} className="space-y-2">
      <input type="hidden" name="paperId" value={paperId} />
      <input type="hidden" name="version" value={version} />
      <ActionMessage state={state} />
      {state.ok ? null : (
        <SubmitButton pendingLabel="Submitting…" disabled={disabled}>
          {label}
        </SubmitButton>
      )}
    </form>
  );
}
