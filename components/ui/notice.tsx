import type { ReactNode } from "react";

export type NoticeTone = "info" | "success" | "error";

const TONES: Record<NoticeTone, string> = {
  info: "border-rule bg-paper-sunk text-ink",
  success: "border-ledger bg-ledger-tint text-ledger-deep",
  error: "border-finding-error bg-finding-error-tint text-finding-error",
};

/** A short message block. Errors are announced at once (role=alert), the rest politely (role=status). */
export function Notice({ tone = "info", title, children, className = "" }: { tone?: NoticeTone; title?: string; children?: ReactNode; className?: string }) {
  return (
    <div role={tone === "error" ? "alert" : "status"} className={`rounded border px-3 py-2 text-sm ${TONES[tone]} ${className}`}>
      {title ? <p className="font-medium">{title}</p> : null}
      {children ? <div className={title ? "mt-0.5" : undefined}>{children}</div> : null}
    </div>
  );
}

/** The form-level message of an action state, or nothing. */
export function ActionMessage({ state }: { state: { ok: boolean; message: string | null } }) {
  if (!state.message) return null;
  return <Notice tone={state.ok ? "success" : "error"}>{state.message}</Notice>;
}
