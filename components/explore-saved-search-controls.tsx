"use client";

import { useActionState } from "react";
import { changeSearchAlerts, removeSavedSearch } from "@/app/(public)/explore/actions";
import { SubmitButton } from "@/components/ui/button";
import { IDLE_STATE } from "@/lib/auth/action-state";

/** The alert switch and delete button of one saved search (a row of components/saved-searches.tsx). */
export function SavedSearchControls({ id, name, alerts }: { id: number; name: string; alerts: boolean }) {
  const [alertState, alertAction] = useActionState(changeSearchAlerts, IDLE_STATE);
  const [deleteState, deleteAction] = useActionState(removeSavedSearch, IDLE_STATE);
  const problem = [alertState, deleteState].find((state) => !state.ok && state.message);
  return (
    <div className="flex items-center gap-2">
      <form action={alertAction}>
        <input type="hidden" name="id" value={id} />
        <input type="hidden" name="alerts" value={alerts ? "off" : "on"} />
        <SubmitButton tone="secondary" size="small" aria-label={`${alerts ? "Turn off" : "Turn on"} e-mail alerts for ${name}`}>
          {alerts ? "Turn alerts off" : "Turn alerts on"}
        </SubmitButton>
      </form>
      <form action={deleteAction}>
        <input type="hidden" name="id" value={id} />
        <SubmitButton tone="danger" size="small" aria-label={`Delete the saved search ${name}`}>
          Delete
        </SubmitButton>
      </form>
      {problem ? (
        <span role="alert" className="text-xs text-finding-error">
          {problem.message}
        </span>
      ) : null}
    </div>
  );
}
