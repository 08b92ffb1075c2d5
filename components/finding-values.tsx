// The figures behind a finding, as a compact list ("reported Δdf 3 · recomputed 4"). Intervals print as
// [lo, hi]. Works in server and client components.

type Value = number | string | boolean | null | { lo: number; hi: number } | unknown;

function show(value: Value): string {
  if (value === null || value === undefined) return "—";
  if (typeof value === "number") return Number.isInteger(value) ? String(value) : String(Number(value.toPrecision(6)));
  if (typeof value === "object" && value !== null && "lo" in value && "hi" in value) {
    const interval = value as { lo: number; hi: number };
    return interval.lo === interval.hi ? show(interval.lo) : `[${show(interval.lo)}, ${show(interval.hi)}]`;
  }
  return String(value);
}

export function FindingValues({ values }: { values: Record<string, unknown> }) {
  const entries = Object.entries(values);
  if (entries.length === 0) return null;
  return (
    <dl className="figures mt-1 flex flex-wrap gap-x-3 gap-y-0.5 text-xxs text-ink-soft">
      {entries.map(([name, value]) => (
        <div key={name} className="flex gap-1">
          <dt className="text-ink-faint">{name}</dt>
          <dd>{show(value)}</dd>
        </div>
      ))}
    </dl>
  );
}
