/** One loop (x against y over a breath) as SVG: axes with round ticks and units, the trace, a dot at its start. */
import { formatNumber, niceTicks } from "./lib/format";
import { type LoopPoint, loopPath, paddedExtent, scaleLinear } from "./lib/loop";

interface LoopPlotProps {
  title: string;
  points: readonly LoopPoint[];
  xLabel: string;
  yLabel: string;
  stroke: string;
  testId: string;
}

const W = 300;
const H = 230;
const M = { left: 46, right: 10, top: 10, bottom: 34 };

function tickDigits(ticks: number[]): number {
  const step = ticks.length > 1 ? Math.abs(ticks[1] - ticks[0]) : 1;
  return step >= 1 ? 0 : step >= 0.1 ? 1 : 2;
}

export function LoopPlot({ title, points, xLabel, yLabel, stroke, testId }: LoopPlotProps) {
  const xDomain = paddedExtent(points.map((p) => p.x));
  const yDomain = paddedExtent(points.map((p) => p.y));
  const x = scaleLinear(xDomain, M.left, W - M.right);
  const y = scaleLinear(yDomain, H - M.bottom, M.top);
  const xTicks = niceTicks(xDomain.min, xDomain.max, 5);
  const yTicks = niceTicks(yDomain.min, yDomain.max, 5);
  const xd = tickDigits(xTicks);
  const yd = tickDigits(yTicks);
  return (
    <figure className="m-0" data-testid={testId} data-points={points.length}>
      <figcaption className="mb-1 text-xs font-medium text-ink-700">{title}</figcaption>
      <svg viewBox={`0 0 ${W} ${H}`} className="h-auto w-full" role="img" aria-label={`${title}: ${yLabel} against ${xLabel}`}>
        <rect x={M.left} y={M.top} width={W - M.left - M.right} height={H - M.top - M.bottom} fill="none" className="stroke-line" />
        {xTicks.map((t) => (
          <g key={`x${t}`}>
            <line x1={x(t)} x2={x(t)} y1={M.top} y2={H - M.bottom} className={t === 0 ? "stroke-ink-400" : "stroke-ink-100"} />
            <text x={x(t)} y={H - M.bottom + 12} fontSize="9" textAnchor="middle" className="fill-ink-500">
              {formatNumber(t, xd)}
            </text>
          </g>
        ))}
        {yTicks.map((t) => (
          <g key={`y${t}`}>
            <line x1={M.left} x2={W - M.right} y1={y(t)} y2={y(t)} className={t === 0 ? "stroke-ink-400" : "stroke-ink-100"} />
            <text x={M.left - 4} y={y(t) + 3} fontSize="9" textAnchor="end" className="fill-ink-500">
              {formatNumber(t, yd)}
            </text>
          </g>
        ))}
        <text x={(M.left + W - M.right) / 2} y={H - 4} fontSize="10" textAnchor="middle" className="fill-ink-900">
          {xLabel}
        </text>
        <text x={10} y={(M.top + H - M.bottom) / 2} fontSize="10" textAnchor="middle" className="fill-ink-900" transform={`rotate(-90 10 ${(M.top + H - M.bottom) / 2})`}>
          {yLabel}
        </text>
        {points.length > 1 ? (
          <>
            <path d={loopPath(points, x, y)} fill="none" stroke={stroke} strokeWidth="1.5" strokeLinejoin="round" />
            <circle cx={x(points[0].x)} cy={y(points[0].y)} r="3" fill={stroke} />
          </>
        ) : null}
      </svg>
    </figure>
  );
}
