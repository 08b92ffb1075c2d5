// A share over publication years: the line of shares and the band of Wilson 95 % intervals, plain SVG
// drawn on the server. aria-hidden: the data table beside it carries the same figures for everyone.

export interface TrendPoint {
  year: number;
  share: number | null;
  low: number | null;
  high: number | null;
}

const WIDTH = 640;
const HEIGHT = 220;
const LEFT = 44;
const BOTTOM = 24;
const TOP = 10;

export function TrendLine({ points }: { points: TrendPoint[] }) {
  const shown = points.filter((point) => point.share !== null);
  if (shown.length === 0) return null;
  const firstYear = shown[0].year;
  const lastYear = shown.at(-1)!.year;
  const max = Math.max(0.05, ...shown.map((point) => point.high ?? 0));
  const x = (year: number) => LEFT + (lastYear === firstYear ? (WIDTH - LEFT) / 2 : ((year - firstYear) / (lastYear - firstYear)) * (WIDTH - LEFT - 8));
  const y = (share: number) => TOP + (1 - share / max) * (HEIGHT - TOP - BOTTOM);
  const line = shown.map((point, at) => `${at === 0 ? "M" : "L"}${x(point.year).toFixed(1)},${y(point.share!).toFixed(1)}`).join(" ");
  const band = [...shown.map((point) => `${x(point.year).toFixed(1)},${y(point.high!).toFixed(1)}`), ...[...shown].reverse().map((point) => `${x(point.year).toFixed(1)},${y(point.low!).toFixed(1)}`)].join(" ");
  const yearStep = Math.max(1, Math.ceil((lastYear - firstYear) / 8));
  const years: number[] = [];
  for (let year = firstYear; year <= lastYear; year += yearStep) years.push(year);
  return (
    <svg viewBox={`0 0 ${WIDTH} ${HEIGHT}`} className="w-full max-w-3xl" aria-hidden="true" focusable="false">
      {[0, max / 2, max].map((tick) => (
        <g key={tick}>
          <line x1={LEFT} x2={WIDTH} y1={y(tick)} y2={y(tick)} className="stroke-rule" strokeWidth={1} />
          <text x={LEFT - 6} y={y(tick) + 3} textAnchor="end" className="fill-ink-faint text-[10px]">
            {(tick * 100).toFixed(tick < 0.1 ? 1 : 0)} %
          </text>
        </g>
      ))}
      {years.map((year) => (
        <text key={year} x={x(year)} y={HEIGHT - 6} textAnchor="middle" className="fill-ink-faint text-[10px]">
          {year}
        </text>
      ))}
      <polygon points={band} className="fill-ledger/15" />
      <path d={line} className="fill-none stroke-ledger" strokeWidth={1.8} />
      {shown.map((point) => (
        <circle key={point.year} cx={x(point.year)} cy={y(point.share!)} r={2.5} className="fill-ledger" />
      ))}
    </svg>
  );
}
