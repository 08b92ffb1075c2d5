export function StatTile({ label, value, detail }: { label: string; value: string; detail?: string }) {
  return (
    <div className="rounded border border-rule bg-paper-raised px-4 py-3">
      <dt className="text-xs uppercase tracking-wide text-ink-faint">{label}</dt>
      <dd className="figures mt-1 text-2xl font-semibold text-ink">{value}</dd>
      {detail ? <dd className="mt-0.5 text-xs text-ink-soft">{detail}</dd> : null}
    </div>
  );
}
