/** Fitledger's mark: two ruled ledger lines and a tick, drawn inline so it needs no request. */
export function LedgerMark({ className = "h-5 w-5" }: { className?: string }) {
  return (
    <svg viewBox="0 0 24 24" aria-hidden="true" className={className} fill="none" stroke="currentColor" strokeWidth="1.8" strokeLinecap="round">
      <path d="M3 7h18M3 12h11M3 17h8" />
      <path d="M15 16.5l2.2 2.2L21.5 13" />
    </svg>
  );
}
