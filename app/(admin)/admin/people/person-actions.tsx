"use client";

import { useActionState, type ReactNode } from "react";
import { SubmitButton, type ButtonTone } from "@/components/ui/button";
import { IDLE_STATE, type FormAction } from "@/lib/auth/action-state";
import { ROLE_LABELS, ROLE_ORDER, type AccountStatus, type Role } from "@/lib/auth/roles";
import { approveApplicant, changeAccountRole, declineApplicant, reactivateAccount, suspendAccount } from "./actions";

interface Person {
  id: number;
  name: string;
  role: Role;
  status: AccountStatus;
}

const INPUT = "rounded border border-rule-strong bg-paper-raised px-2 py-1 text-xs";

/** One small form with its own result line; the person's id travels as a hidden field. */
function ActionForm({ action, person, label, tone = "secondary", children }: { action: FormAction; person: Person; label: string; tone?: ButtonTone; children?: ReactNode }) {
  const [state, formAction] = useActionState(action, IDLE_STATE);
  const messageId = `action-${label.replace(/\W+/g, "-").toLowerCase()}-${person.id}`;
  const fieldError = Object.values(state.fieldErrors).flat()[0];
  const message = fieldError ?? state.message;
  return (
    <form action={formAction} className="flex flex-wrap items-center gap-1.5" aria-describedby={message ? messageId : undefined}>
      <input type="hidden" name="userId" value={person.id} />
      {children}
      <SubmitButton tone={tone} size="small" pendingLabel="…">
        {label}
      </SubmitButton>
      {message ? (
        <p id={messageId} role={state.ok ? "status" : "alert"} className={`basis-full text-xs ${state.ok ? "text-ledger-deep" : "text-finding-error"}`}>
          {message}
        </p>
      ) : null}
    </form>
  );
}

function RoleSelect({ person, defaultRole }: { person: Person; defaultRole: Role }) {
  const id = `role-${person.id}`;
  return (
    <>
      <label htmlFor={id} className="sr-only">
        Role for {person.name}
      </label>
      <select id={id} name="role" defaultValue={defaultRole} className={INPUT}>
        {ROLE_ORDER.map((role) => (
          <option key={role} value={role}>
            {ROLE_LABELS[role]}
          </option>
        ))}
      </select>
    </>
  );
}

function ReasonInput({ person, what }: { person: Person; what: string }) {
  const id = `${what}-reason-${person.id}`;
  return (
    <>
      <label htmlFor={id} className="sr-only">
        Reason for {what === "decline" ? "declining" : "suspending"} {person.name} (sent to them)
      </label>
      <input id={id} name="reason" required maxLength={1000} placeholder="Reason (sent to them)" className={`${INPUT} w-48`} />
    </>
  );
}

export function PersonActions({ person, isSelf }: { person: Person; isSelf: boolean }) {
  if (isSelf) return <p className="text-xs text-ink-faint">Your own account: another admin can change its role or suspend it.</p>;
  return (
    <div className="space-y-1.5">
      {person.status === "pending" || person.status === "declined" ? (
        <ActionForm action={approveApplicant} person={person} label="Approve" tone="primary">
          <RoleSelect person={person} defaultRole="contributor" />
        </ActionForm>
      ) : null}
      {person.status === "pending" ? (
        <ActionForm action={declineApplicant} person={person} label="Decline" tone="danger">
          <ReasonInput person={person} what="decline" />
        </ActionForm>
      ) : null}
      {person.status === "active" ? (
        <>
          <ActionForm action={changeAccountRole} person={person} label="Change role">
            <RoleSelect person={person} defaultRole={person.role} />
          </ActionForm>
          <ActionForm action={suspendAccount} person={person} label="Suspend" tone="danger">
            <ReasonInput person={person} what="suspend" />
          </ActionForm>
        </>
      ) : null}
      {person.status === "suspended" ? <ActionForm action={reactivateAccount} person={person} label="Reactivate" tone="primary" /> : null}
    </div>
  );
}
