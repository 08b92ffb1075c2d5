import type { Severity } from "@/lib/recheck/types";

const STYLES: Record<Severity, string> = {
  error: "bg-finding-error-tint text-finding-error border-finding-error/30",
  warning: "bg-finding-warning-tint text-finding-warning border-finding-warning/30",
  note: "bg-finding-note-tint text-finding-note border-finding-note/30",
};

/** Severity in words (never colour alone), tinted by the signal palette. */
export function SeverityBadge({ severity }: { severity: Severity }) {
  return <span className={`inline-block rounded-sm border px-1.5 py-px text-xxs font-medium uppercase tracking-wide ${STYLES[severity]}`}>{severity}</span>;
}
