"use client";

import { useActionState } from "react";
import { SubmitButton } from "@/components/ui/button";
import { IDLE_STATE } from "@/lib/auth/action-state";
import { retryOutboxMessage } from "./actions";

export function RetryButton({ messageId }: { messageId: number }) {
  const [state, action] = useActionState(retryOutboxMessage, IDLE_STATE);
  return (
    <form action={action} className="space-y-1">
      <input type="hidden" name="messageId" value={messageId} />
      <SubmitButton tone="secondary" size="small" pendingLabel="…">
        Try now
      </SubmitButton>
      {state.message ? (
        <p role={state.ok ? "status" : "alert"} className={`text-xs ${state.ok ? "text-ledger-deep" : "text-finding-error"}`}>
          {state.message}
        </p>
      ) : null}
    </form>
  );
}
