"use client";
/**
 * Live preview: runs the current, unsaved definition in the browser with the engine's
 * createSimulation against an adjustable patient on the project's rig. Play at 1×, 2× or 5× real
 * time, pause, step one controller scan, send operator events. The active step is reported to the
 * canvas (it lights up); pressure and flow scroll underneath with the step changes marked.
 *
 * Per frame nothing goes through React: samples go into a typed-array buffer and uPlot redraws;
 * React state changes only when the step changes and a few times a second for the readouts.
 */
import { useCallback, useEffect, useRef, useState } from "react";
import { useMachine } from "@xstate/react";
import { SEQUENCE_EVENTS, type SequenceDefinition, type SequenceEvent } from "@/machines/schema";
import type { LiveSimulation, Rig } from "@/lib/sim/types";
import { previewMachine, SPEEDS, type Speed } from "./preview/preview-machine";
import { createSimulation as engineCreateSimulation, type CreateSimulation } from "./preview/engine";
import { FrameMeter, type FrameStats } from "./preview/frame-meter";
import { TraceBuffer } from "./preview/trace-buffer";
import { TraceChart, type TraceChartHandle } from "./preview/trace-chart";
import { DEFAULT_PATIENT, PatientControls, toEnginePatient, type PreviewPatient } from "./preview/patient-controls";
import { PreviewReadouts } from "./preview/preview-readouts";

export interface LivePreviewProps {
  definition: SequenceDefinition;
  rig: Rig;
  onActiveStep?: (step: string | null) => void;
  /** The engine entry point; tests pass a fake. */
  createSimulation?: CreateSimulation | null;
}

const WINDOW_S = 10;
// The engine may record every 1 ms physics step; 4 ms keeps the trace sharp at a quarter of the points.
const TRACE_DT_S = 0.004;
const MAX_FRAME_S = 0.1; // a stalled tab resumes without a burst of simulated seconds
const DURATION_S = 600; // the engine's limit per simulation; the preview starts over after it
const REBUILD_DELAY_MS = 300;

export function LivePreview({ definition, rig, onActiveStep, createSimulation = engineCreateSimulation }: LivePreviewProps) {
  const [patient, setPatient] = useState<PreviewPatient>(DEFAULT_PATIENT);
  const [buffer] = useState(() => new TraceBuffer(Math.ceil((WINDOW_S / TRACE_DT_S) * 2), WINDOW_S, TRACE_DT_S));
  const [meter] = useState(() => new FrameMeter());
  const sim = useRef<LiveSimulation | null>(null);
  const chart = useRef<TraceChartHandle>(null);
  const lastStep = useRef<string | null>(null);
  const lastReadout = useRef(0);
  const [readout, setReadout] = useState<{ t: number; step: string | null; stats: FrameStats | null }>({ t: 0, step: null, stats: null });
  const [note, setNote] = useState<string | null>(null);

  const reportStep = useCallback(
    (step: string | null) => {
      if (step === lastStep.current) return;
      lastStep.current = step;
      onActiveStep?.(step);
    },
    [onActiveStep],
  );

  /** Move what the engine recorded into the trace and publish the step; cheap enough for every frame. */
  const pump = useCallback(
    (force: boolean) => {
      const s = sim.current;
      if (!s) return;
      buffer.push(s.drain());
      chart.current?.redraw(s.time);
      reportStep(s.activeStep);
      const now = performance.now();
      if (force || now - lastReadout.current > 250) {
        lastReadout.current = now;
        setReadout({ t: s.time, step: s.activeStep, stats: meter.stats() });
      }
    },
    [buffer, meter, reportStep],
  );

  const [snapshot, send] = useMachine(previewMachine);
  const speed = snapshot.context.speed;
  const running = snapshot.matches("running");
  const failed = snapshot.matches("failed");

  // The frame loop, exactly while the controller is running: advance by the wall time since the
  // last frame times the speed, then move the samples to the trace.
  useEffect(() => {
    if (!running) return;
    let raf = 0;
    let last = performance.now();
    // Simulated time owed to the wall clock: the engine advances by whole scans, so a frame's
    // remainder carries over instead of being lost (16.7 ms frames on a 10 ms scan would run at 0.6×).
    let owed = 0;
    meter.reset();
    const tick = (now: number) => {
      const dt = Math.min(now - last, MAX_FRAME_S * 1000) / 1000;
      last = now;
      const s = sim.current;
      if (s) {
        const before = s.time;
        const t0 = performance.now();
        try {
          owed = Math.min(owed + dt * speed, MAX_FRAME_S * speed);
          if (owed > 0) s.advance(owed);
        } catch (err) {
          send({ type: "FAIL", error: err instanceof Error ? err.message : String(err) });
          return;
        }
        const simS = s.time - before;
        owed -= simS;
        meter.record(now, simS / rig.scanPeriodS, performance.now() - t0, simS);
        pump(false);
      }
      raf = requestAnimationFrame(tick);
    };
    raf = requestAnimationFrame(tick);
    return () => cancelAnimationFrame(raf);
  }, [meter, pump, rig.scanPeriodS, running, send, speed]);

  const stepScan = () => {
    send({ type: "STEP" });
    sim.current?.stepScan();
    pump(true);
  };

  /** A fresh simulation of the current definition and patient; the trace starts over. */
  const rebuild = useCallback((): boolean => {
    if (!createSimulation) return false;
    try {
      sim.current = createSimulation({
        definition,
        patient: toEnginePatient(patient),
        rig,
        durationS: DURATION_S,
        // The trace keeps one point per 4 ms anyway; recording every 1 ms step would only fill memory.
        sampleEvery: 4,
        // The preview runs as long as someone watches; the default budget is meant for batch runs.
        wallBudgetMs: 24 * 3600 * 1000,
      });
    } catch (err) {
      sim.current = null;
      reportStep(null);
      send({ type: "FAIL", error: err instanceof Error ? err.message : String(err) });
      return false;
    }
    buffer.clear();
    meter.reset();
    lastStep.current = null;
    pump(true);
    return true;
  }, [buffer, createSimulation, definition, meter, patient, pump, reportStep, rig, send]);

  // Rebuild when the definition, patient or rig changes: at once on mount, then after edits settle.
  const mounted = useRef(false);
  useEffect(() => {
    const first = !mounted.current;
    mounted.current = true;
    const id = setTimeout(
      () => {
        if (rebuild()) {
          send({ type: "RECOVER" });
          if (!first) setNote("Restarted: the sequence or the patient changed.");
        }
      },
      first ? 0 : REBUILD_DELAY_MS,
    );
    return () => clearTimeout(id);
  }, [rebuild, send]);

  // The engine stops at its duration limit: start over rather than freeze.
  useEffect(() => {
    if (running && readout.t >= DURATION_S - 1) rebuild();
  }, [readout.t, rebuild, running]);

  useEffect(() => () => onActiveStep?.(null), [onActiveStep]);

  const sendEvent = (e: SequenceEvent) => sim.current?.send(e);
  const handled = handledEvents(definition);
  const unavailable = !createSimulation;

  return (
    <section className="flex flex-col gap-2 rounded border border-ink-200 bg-surface p-2" aria-label="Live preview" data-testid="live-preview" data-state={String(snapshot.value)}>
      <div className="flex flex-wrap items-center gap-2">
        <h2 className="text-sm font-semibold text-ink-800">Live preview</h2>
        <button
          type="button"
          onClick={() => {
            send({ type: running ? "PAUSE" : "PLAY" });
            // The readouts are throttled while running; show exactly where it stopped.
            if (running) pump(true);
          }}
          disabled={unavailable || failed}
          className="rounded bg-glass-700 px-3 py-0.5 text-xs font-semibold text-white hover:bg-glass-800 disabled:opacity-40"
          data-testid="preview-play"
          aria-pressed={running}
        >
          {running ? "Pause" : "Play"}
        </button>
        <button type="button" onClick={stepScan} disabled={unavailable || failed} className="rounded border border-ink-300 px-2 py-0.5 text-xs disabled:opacity-40" data-testid="preview-step" title="Advance one controller scan">
          Step one scan ({Math.round(rig.scanPeriodS * 1000)} ms)
        </button>
        <div role="radiogroup" aria-label="Speed" className="flex overflow-hidden rounded border border-ink-300">
          {SPEEDS.map((s: Speed) => (
            <button
              key={s}
              type="button"
              role="radio"
              aria-checked={speed === s}
              onClick={() => send({ type: "SPEED", speed: s })}
              className={`px-2 py-0.5 text-xs ${speed === s ? "bg-ink-800 text-white" : "bg-surface"}`}
              data-testid={`preview-speed-${s}`}
            >
              {s}×
            </button>
          ))}
        </div>
        <button
          type="button"
          onClick={() => {
            if (rebuild()) send({ type: "RECOVER" });
            setNote(null);
          }}
          disabled={unavailable}
          className="rounded border border-ink-300 px-2 py-0.5 text-xs disabled:opacity-40"
          data-testid="preview-restart"
        >
          Restart
        </button>
        <span className="mx-1 h-4 w-px bg-ink-200" aria-hidden="true" />
        <span className="text-xs text-ink-600">Operator:</span>
        {SEQUENCE_EVENTS.map((e) => (
          <button
            key={e}
            type="button"
            onClick={() => sendEvent(e)}
            disabled={unavailable || failed}
            title={handled.has(e) ? `Send ${e} (delivered at the next scan)` : `No step reacts to ${e}`}
            className={`rounded border px-1.5 py-0.5 font-mono text-[11px] disabled:opacity-40 ${handled.has(e) ? "border-ink-400" : "border-dashed border-ink-200 text-ink-400"}`}
            data-testid={`preview-event-${e}`}
          >
            {e}
          </button>
        ))}
      </div>
      {unavailable ? <p className="text-xs text-ember-700">The simulation engine is not part of this build yet; the preview cannot run.</p> : null}
      {failed ? (
        <p role="alert" className="text-xs text-danger-700" data-testid="preview-error">
          The preview cannot run this definition: {snapshot.context.error}
        </p>
      ) : null}
      <TraceChart ref={chart} buffer={buffer} windowS={WINDOW_S} />
      <PreviewReadouts t={readout.t} step={readout.step} stats={running ? readout.stats : null} note={note} />
      <PatientControls patient={patient} onChange={setPatient} />
    </section>
  );
}

/** Events some step reacts to (others are shown but marked as doing nothing). */
function handledEvents(def: SequenceDefinition): Set<string> {
  const out = new Set<string>();
  for (const s of Object.values(def.machine.states)) for (const k of Object.keys(s.on ?? {})) out.add(k);
  return out;
}
