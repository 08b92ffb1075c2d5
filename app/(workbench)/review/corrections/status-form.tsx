"use client";

import { useActionState } from "react";
import { SubmitButton } from "@/components/ui/button";
import { ActionMessage } from "@/components/ui/notice";
import { IDLE_STATE } from "@/lib/auth/action-state";
import { changeCorrectionStatus } from "./actions";

export function CorrectionStatusForm({ correctionId, next }: { correctionId: number; next: "open" | "closed" }) {
  const [state, action] = useActionState(changeCorrectionStatus, IDLE_STATE);
  return (
    <form action={action} className="flex items-center gap-2">
      <input type="hidden" name="correctionId" value={correctionId} />
      <input type="hidden" name="status" value={next} />
      <ActionMessage state={state} />
      {state.ok ? null : (
        <SubmitButton tone="secondary" size="small" pendingLabel="Saving…">
          {next === "closed" ? "Mark as dealt with" : "Open again"}
        </SubmitButton>
      )}
    </form>
  );
}
