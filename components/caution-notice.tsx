/** DESIGN §9: a finding is a possible inconsistency, not an accusation. Shown on pages and in exports. */
export const CAUTION_TEXT =
  "A finding is a possible inconsistency computed from the numbers as printed and as coded. It can come from a typo, a coding mistake, rounding or a limit of the recheck engine; it is not evidence of misconduct.";

export function CautionNotice({ className = "" }: { className?: string }) {
  return (
    <aside aria-label="How to read findings" className={`rounded border border-rule bg-paper-sunk px-3 py-2 text-xs text-ink-soft ${className}`}>
      <strong className="font-medium text-ink">How to read a finding.</strong> {CAUTION_TEXT}
    </aside>
  );
}
