/**
 * Bag displaced volume against arm angle, drawn as a small SVG so it renders on the server and in
 * the form alike (no canvas library for a dozen points). Points out of ascending-angle order are
 * marked: the engine interpolates on ascending angle, so a reversed pair is almost always a typo.
 */
export interface CalibrationPlotPoint {
  angleDeg: number;
  volumeMl: number;
}

interface Props {
  points: CalibrationPlotPoint[];
  width?: number;
  height?: number;
}

const PAD = { left: 44, right: 12, top: 10, bottom: 30 };

function niceMax(value: number): number {
  if (!(value > 0)) return 1;
  const magnitude = 10 ** Math.floor(Math.log10(value));
  const scaled = value / magnitude;
  const step = scaled <= 1 ? 1 : scaled <= 2 ? 2 : scaled <= 5 ? 5 : 10;
  return step * magnitude;
}

export function CalibrationPlot({ points, width = 320, height = 180 }: Props) {
  const finite = points.filter((p) => Number.isFinite(p.angleDeg) && Number.isFinite(p.volumeMl));
  const maxAngle = niceMax(Math.max(0, ...finite.map((p) => p.angleDeg)));
  const maxVolume = niceMax(Math.max(0, ...finite.map((p) => p.volumeMl)));
  const plotW = width - PAD.left - PAD.right;
  const plotH = height - PAD.top - PAD.bottom;
  const x = (angle: number) => PAD.left + (angle / maxAngle) * plotW;
  const y = (volume: number) => PAD.top + plotH - (volume / maxVolume) * plotH;
  const line = finite.map((p) => `${x(p.angleDeg).toFixed(1)},${y(p.volumeMl).toFixed(1)}`).join(" ");

  return (
    <svg
      role="img"
      aria-label={`Bag volume against arm angle, ${finite.length} points`}
      viewBox={`0 0 ${width} ${height}`}
      className="h-auto w-full max-w-sm text-ink-700"
    >
      <rect x={PAD.left} y={PAD.top} width={plotW} height={plotH} fill="none" stroke="currentColor" strokeOpacity={0.2} />
      {[0.25, 0.5, 0.75].map((f) => (
        <line
          key={f}
          x1={PAD.left}
          x2={PAD.left + plotW}
          y1={PAD.top + plotH * f}
          y2={PAD.top + plotH * f}
          stroke="currentColor"
          strokeOpacity={0.08}
        />
      ))}
      <polyline points={line} fill="none" stroke="var(--color-glass-600)" strokeWidth={2} />
      {finite.map((p, i) => {
        const outOfOrder = i > 0 && p.angleDeg <= finite[i - 1].angleDeg;
        return (
          <circle
            key={i}
            cx={x(p.angleDeg)}
            cy={y(p.volumeMl)}
            r={outOfOrder ? 4 : 3}
            fill={outOfOrder ? "var(--color-ember-500)" : "var(--color-glass-600)"}
          >
            <title>{`${p.angleDeg} deg → ${p.volumeMl} mL${outOfOrder ? " (angle not ascending)" : ""}`}</title>
          </circle>
        );
      })}
      <text x={PAD.left} y={height - 8} fontSize={10} fill="currentColor" fillOpacity={0.7}>
        0
      </text>
      <text x={PAD.left + plotW} y={height - 8} fontSize={10} textAnchor="end" fill="currentColor" fillOpacity={0.7}>
        {maxAngle} deg
      </text>
      <text x={PAD.left - 6} y={PAD.top + 8} fontSize={10} textAnchor="end" fill="currentColor" fillOpacity={0.7}>
        {maxVolume}
      </text>
      <text x={PAD.left - 6} y={PAD.top + plotH} fontSize={10} textAnchor="end" fill="currentColor" fillOpacity={0.7}>
        0
      </text>
      <text
        x={12}
        y={PAD.top + plotH / 2}
        fontSize={10}
        textAnchor="middle"
        transform={`rotate(-90 12 ${PAD.top + plotH / 2})`}
        fill="currentColor"
        fillOpacity={0.7}
      >
        mL
      </text>
    </svg>
  );
}
