// Horizontal bars of shares with their 95 % interval as a whisker: plain SVG, drawn on the server. The
// chart is decoration for sighted readers (aria-hidden); the data table beside it carries the figures.

export interface IntervalBar {
  label: string;
  share: number | null;
  low: number | null;
  high: number | null;
  /** short text at the end of the bar, e.g. "12.5 % (81/648)" */
  note: string;
}

const ROW = 22;
const LABEL_WIDTH = 230;
const PLOT_WIDTH = 360;
const NOTE_WIDTH = 130;

export function IntervalBars({ bars, tone = "ledger" }: { bars: IntervalBar[]; tone?: "ledger" | "error" }) {
  const max = Math.max(0.05, ...bars.map((bar) => bar.high ?? 0));
  const scale = (value: number) => (value / max) * PLOT_WIDTH;
  const height = bars.length * ROW + 24;
  const fill = tone === "error" ? "fill-finding-error/70" : "fill-ledger/70";
  const ticks = [0, max / 2, max];
  return (
    <svg viewBox={`0 0 ${LABEL_WIDTH + PLOT_WIDTH + NOTE_WIDTH} ${height}`} className="w-full max-w-3xl" aria-hidden="true" focusable="false">
      {ticks.map((tick) => (
        <g key={tick}>
          <line x1={LABEL_WIDTH + scale(tick)} x2={LABEL_WIDTH + scale(tick)} y1={0} y2={bars.length * ROW} className="stroke-rule" strokeWidth={1} />
          <text x={LABEL_WIDTH + scale(tick)} y={bars.length * ROW + 14} textAnchor="middle" className="fill-ink-faint text-[10px]">
            {(tick * 100).toFixed(tick < 0.1 ? 1 : 0)} %
          </text>
        </g>
      ))}
      {bars.map((bar, position) => {
        const y = position * ROW;
        return (
          <g key={bar.label}>
            <text x={LABEL_WIDTH - 6} y={y + ROW / 2 + 4} textAnchor="end" className="fill-ink text-[11px]">
              {bar.label.length > 38 ? `${bar.label.slice(0, 37)}…` : bar.label}
            </text>
            {bar.share !== null ? <rect x={LABEL_WIDTH} y={y + 5} width={Math.max(1, scale(bar.share))} height={ROW - 10} className={fill} /> : null}
            {bar.low !== null && bar.high !== null ? (
              <g className="stroke-ink" strokeWidth={1.2}>
                <line x1={LABEL_WIDTH + scale(bar.low)} x2={LABEL_WIDTH + scale(bar.high)} y1={y + ROW / 2} y2={y + ROW / 2} />
                <line x1={LABEL_WIDTH + scale(bar.low)} x2={LABEL_WIDTH + scale(bar.low)} y1={y + 6} y2={y + ROW - 6} />
                <line x1={LABEL_WIDTH + scale(bar.high)} x2={LABEL_WIDTH + scale(bar.high)} y1={y + 6} y2={y + ROW - 6} />
              </g>
            ) : null}
            <text x={LABEL_WIDTH + PLOT_WIDTH + 8} y={y + ROW / 2 + 4} className="fill-ink-soft text-[10px]">
              {bar.note}
            </text>
          </g>
        );
      })}
    </svg>
  );
}
