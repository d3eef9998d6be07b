"use client";
/** Simulated time, the active step, and the measured smoothness of the preview loop. */
import type { FrameStats } from "./frame-meter";

export function PreviewReadouts({ t, step, stats, note }: { t: number; step: string | null; stats: FrameStats | null; note: string | null }) {
  return (
    <div className="flex flex-wrap items-center gap-x-4 gap-y-1 text-xs text-ink-700" aria-live="off">
      <span>
        t = <span className="font-mono" data-testid="preview-time">{t.toFixed(2)}</span> s
      </span>
      <span>
        step: <strong className="font-mono" data-testid="preview-step-name">{step ?? "–"}</strong>
      </span>
      {stats ? (
        <span className="font-mono text-ink-500" data-testid="preview-stats" data-fps={stats.fps.toFixed(1)} data-scans={stats.scansPerS.toFixed(0)} data-engine-ms={stats.engineMsPerFrame.toFixed(2)}>
          {stats.fps.toFixed(0)} fps · {stats.scansPerS.toFixed(0)} scans/s · engine {stats.engineMsPerFrame.toFixed(2)} ms/frame · {stats.realtimeFactor.toFixed(2)}× real time
        </span>
      ) : null}
      {note ? <span className="text-ink-500">{note}</span> : null}
    </div>
  );
}
