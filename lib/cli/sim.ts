/**
 * The simulation CLI: `npm run -s sim -- [options]` (issue 3 §6; outside checks rely on this contract).
 * Exit 0 on success; exit 2 with a message on stderr for bad input; exit 1 for an unexpected failure.
 */
import { readFileSync, writeFileSync } from "node:fs";
import { SequenceError } from "@/machines/compile";
import { TEMPLATE_IDS, getTemplate } from "@/machines/templates";
import { effectiveUnit, type SequenceDefinition } from "@/machines/schema";
import { DEFAULT_RIG } from "@/lib/sim/default-rig";
import { SimError } from "@/lib/sim/errors";
import { simulate } from "@/lib/sim/simulate";
import { EFFORT_SHAPES, type PatientInput, type RigInput, type SimResult } from "@/lib/sim/types";
import { UnitError, parseQuantity, parseSettingValue, type Quantity } from "@/lib/units";

class CliError extends Error {}

const USAGE = `usage: npm run -s sim -- (--template NAME | --definition FILE.json) [options]
  --set NAME=VALUE        a setting (repeatable); values may carry units ("0.1 psi", "1 s", "20 /min")
  --lung C=VALUE          compliance (mL/cmH2O, or e.g. "3 mL/hPa"); default 50
  --lung R=VALUE          resistance (cmH2O/(L/s), or e.g. "10 hPa/(L/s)"); default 5
  --lung E2=VALUE         non-linear elastance, cmH2O/L² (default 0)
  --effort shape=none|half-sine|ramp|parabolic-exp  amplitude=cmH2O rate=/min ti=s onset=s variability=0..1 seed=N
  --leak orifice=L/min    mask leak, L/min at 10 cmH2O (or linear=L/min per cmH2O)
  --circuit ideal|rig     ideal circuit (textbook checks) or the default rig profile (default rig)
  --rig FILE.json         another rig profile (implies --circuit rig)
  --duration SECONDS      default 30, at most 600
  --dt SECONDS            physics step, default 0.001
  --scan SECONDS          controller scan period, default 0.01 (or the rig's)
  --seed N                default 1
  --json                  print one JSON object
  --waveform FILE.csv     write the full-resolution waveform
templates: ${TEMPLATE_IDS.join(", ")}`;

interface Args {
  template?: string;
  definition?: string;
  set: Array<[string, string]>;
  lung: Array<[string, string]>;
  effort: Array<[string, string]>;
  leak: Array<[string, string]>;
  circuit: "ideal" | "rig";
  rig?: string;
  duration: string;
  dt?: string;
  scan?: string;
  seed?: string;
  json: boolean;
  waveform?: string;
}

function keyValue(opt: string, v: string): [string, string] {
  const i = v.indexOf("=");
  if (i <= 0) throw new CliError(`${opt} expects NAME=VALUE, got "${v}"`);
  return [v.slice(0, i).trim(), v.slice(i + 1).trim()];
}

function parseArgs(argv: string[]): Args {
  const a: Args = { set: [], lung: [], effort: [], leak: [], circuit: "rig", duration: "30", json: false };
  let circuitGiven = false;
  for (let i = 0; i < argv.length; i++) {
    const opt = argv[i];
    const value = (): string => {
      const v = argv[++i];
      if (v === undefined) throw new CliError(`${opt} needs a value`);
      return v;
    };
    switch (opt) {
      case "--template":
        a.template = value();
        break;
      case "--definition":
        a.definition = value();
        break;
      case "--set":
        a.set.push(keyValue(opt, value()));
        break;
      case "--lung":
        a.lung.push(keyValue(opt, value()));
        break;
      case "--effort":
        a.effort.push(keyValue(opt, value()));
        break;
      case "--leak":
        a.leak.push(keyValue(opt, value()));
        break;
      case "--circuit": {
        const v = value();
        if (v !== "ideal" && v !== "rig") throw new CliError(`--circuit must be "ideal" or "rig", got "${v}"`);
        a.circuit = v;
        circuitGiven = true;
        break;
      }
      case "--rig":
        a.rig = value();
        break;
      case "--duration":
        a.duration = value();
        break;
      case "--dt":
        a.dt = value();
        break;
      case "--scan":
        a.scan = value();
        break;
      case "--seed":
        a.seed = value();
        break;
      case "--json":
        a.json = true;
        break;
      case "--waveform":
        a.waveform = value();
        break;
      case "--help":
      case "-h":
        process.stdout.write(USAGE + "\n");
        process.exit(0);
        break;
      default:
        throw new CliError(`unknown option "${opt}"\n${USAGE}`);
    }
  }
  if (a.template && a.definition) throw new CliError("give either --template or --definition, not both");
  if (!a.template && !a.definition) throw new CliError(`give --template NAME or --definition FILE.json\n${USAGE}`);
  if (a.rig && circuitGiven && a.circuit === "ideal") throw new CliError("--rig cannot be combined with --circuit ideal");
  return a;
}

function readJson(file: string, what: string): unknown {
  let text: string;
  try {
    text = readFileSync(file, "utf8");
  } catch (e) {
    throw new CliError(`cannot read ${what} file "${file}": ${(e as NodeJS.ErrnoException).code ?? (e as Error).message}`);
  }
  try {
    return JSON.parse(text);
  } catch (e) {
    throw new CliError(`${what} file "${file}" is not valid JSON: ${(e as Error).message}`);
  }
}

function quantity(opt: string, text: string, q: Quantity): number {
  try {
    return parseQuantity(text, q);
  } catch (e) {
    if (e instanceof UnitError) throw new CliError(`${opt}: ${e.message}`);
    throw e;
  }
}

function positive(opt: string, v: number, what: string): number {
  if (!(v > 0)) throw new CliError(`${opt}: ${what} must be above 0 (got ${v})`);
  return v;
}

function integer(opt: string, text: string): number {
  const n = Number(text);
  if (!Number.isInteger(n)) throw new CliError(`${opt} must be a whole number, got "${text}"`);
  return n;
}

function buildPatient(a: Args): { patient: PatientInput; effortSeed?: number } {
  let c = 50;
  let r = 5;
  let e2 = 0;
  for (const [k, v] of a.lung) {
    switch (k.toUpperCase()) {
      case "C":
        c = positive("--lung C", quantity("--lung C", v, "compliance"), "compliance");
        break;
      case "R":
        r = positive("--lung R", quantity("--lung R", v, "resistance"), "resistance");
        break;
      case "E2":
        e2 = quantity("--lung E2", v, "dimensionless");
        if (e2 < 0) throw new CliError(`--lung E2: non-linear elastance cannot be negative (got ${e2})`);
        break;
      default:
        throw new CliError(`--lung knows C, R and E2, not "${k}"`);
    }
  }
  const effort: NonNullable<PatientInput["effort"]> = {};
  let effortSeed: number | undefined;
  for (const [k, v] of a.effort) {
    const opt = `--effort ${k}`;
    switch (k) {
      case "shape":
        if (!(EFFORT_SHAPES as readonly string[]).includes(v)) {
          throw new CliError(`${opt}: shape must be one of ${EFFORT_SHAPES.join(", ")}, got "${v}"`);
        }
        effort.shape = v as (typeof EFFORT_SHAPES)[number];
        break;
      case "amplitude":
        effort.amplitudeCmH2O = quantity(opt, v, "pressure");
        break;
      case "rate":
        effort.ratePerMin = quantity(opt, v, "rate");
        break;
      case "ti":
        effort.effortTimeS = quantity(opt, v, "time");
        break;
      case "onset":
        effort.onsetS = quantity(opt, v, "time");
        break;
      case "variability":
        effort.variability = quantity(opt, v, "dimensionless");
        break;
      case "seed":
        effortSeed = integer(opt, v);
        break;
      default:
        throw new CliError(`--effort knows shape, amplitude, rate, ti, onset, variability and seed, not "${k}"`);
    }
  }
  if (effort.amplitudeCmH2O !== undefined && effort.shape === undefined) effort.shape = "half-sine";
  let leak: PatientInput["leak"];
  for (const [k, v] of a.leak) {
    if (k !== "orifice" && k !== "linear") throw new CliError(`--leak takes orifice=VALUE or linear=VALUE, not "${k}"`);
    leak = { kind: k, coefficient: quantity(`--leak ${k}`, v, k === "orifice" ? "flow" : "dimensionless") };
  }
  return {
    patient: { complianceMlPerCmH2O: c, resistanceCmH2OPerLps: r, e2CmH2OPerL2: e2, effort, ...(leak ? { leak } : {}) },
    effortSeed,
  };
}

function buildSettings(def: SequenceDefinition, pairs: Array<[string, string]>): Record<string, number | string> {
  const out: Record<string, number | string> = {};
  for (const [name] of pairs) {
    if (!def.settings[name]) {
      throw new CliError(`--set ${name}: unknown setting (settings: ${Object.keys(def.settings).join(", ")})`);
    }
  }
  // Choices first: a unitBy setting (trigger sensitivity) is read in the unit of the choice as set here,
  // whichever order the --set options came in.
  const choices: Record<string, string> = {};
  for (const [name, text] of pairs) if (def.settings[name].options) choices[name] = text;
  for (const [name, text] of pairs) {
    const s = def.settings[name];
    if (s.options) {
      out[name] = text;
      continue;
    }
    try {
      out[name] = parseSettingValue(text, effectiveUnit(s, def.settings, choices));
    } catch (e) {
      if (e instanceof UnitError) throw new CliError(`--set ${name}: ${e.message}`);
      throw e;
    }
  }
  return out;
}

const round = (v: number | null, digits = 4): number | null =>
  v === null || !Number.isFinite(v) ? null : Math.round(v * 10 ** digits) / 10 ** digits;

function jsonOutput(r: SimResult) {
  const s = r.summary;
  return {
    summary: {
      pip: round(s.pip),
      pplat: round(s.pplat),
      peep: round(s.peep),
      vti: round(s.vti),
      vte: round(s.vte),
      rr: round(s.rr),
      ie: round(s.ie),
      minuteVolume: round(s.minuteVolume),
      breaths: s.breaths,
      triggerLatencyMs: {
        mean: round(s.triggerLatencyMs.mean, 2),
        p95: round(s.triggerLatencyMs.p95, 2),
        max: round(s.triggerLatencyMs.max, 2),
        n: s.triggerLatencyMs.n,
      },
      asynchronyIndex: round(s.asynchronyIndex, 2),
      ineffectiveEfforts: s.ineffectiveEfforts,
      doubleTriggers: s.doubleTriggers,
      autoTriggers: s.autoTriggers,
    },
    breaths: r.breaths.map((b) => ({
      start: round(b.start),
      trigger: b.trigger,
      effortOnset: round(b.effortOnset),
      latencyMs: round(b.latencyMs, 2),
      pip: round(b.pip),
      pplat: round(b.pplat),
      peep: round(b.peep),
      vti: round(b.vti),
      vte: round(b.vte),
      ti: round(b.ti),
      te: round(b.te),
    })),
    alarms: r.alarms.map((a) => ({ t: round(a.t), kind: a.kind, message: a.message })),
  };
}

const cell = (v: number | null, digits = 1): string => (v === null || !Number.isFinite(v) ? "—" : v.toFixed(digits));

function tableOutput(r: SimResult, name: string): string {
  const s = r.summary;
  const lines: string[] = [];
  lines.push(`${name}: ${s.breaths} breaths`);
  lines.push(
    `PIP ${cell(s.pip)} cmH2O  Pplat ${cell(s.pplat)} cmH2O  PEEP ${cell(s.peep)} cmH2O  Vti ${cell(s.vti)} mL  Vte ${cell(s.vte)} mL`,
  );
  lines.push(`RR ${cell(s.rr)} /min  I:E 1:${cell(s.ie, 2)}  minute volume ${cell(s.minuteVolume, 2)} L/min`);
  const l = s.triggerLatencyMs;
  lines.push(`trigger latency: mean ${cell(l.mean)} ms, p95 ${cell(l.p95)} ms, max ${cell(l.max)} ms (n = ${l.n})`);
  lines.push(
    `asynchrony index ${cell(s.asynchronyIndex)} %: ineffective ${s.ineffectiveEfforts}, double ${s.doubleTriggers}, auto ${s.autoTriggers}, short ${s.shortCycles}, prolonged ${s.prolongedCycles}`,
  );
  lines.push("");
  lines.push("   start  trigger   latency     PIP   Pplat   PEEP     Vti     Vte     Ti     Te");
  for (const b of r.breaths) {
    lines.push(
      [
        cell(b.start, 2).padStart(8),
        b.trigger.padStart(8),
        (b.latencyMs === null ? "—" : `${b.latencyMs.toFixed(0)} ms`).padStart(9),
        cell(b.pip).padStart(7),
        cell(b.pplat).padStart(7),
        cell(b.peep).padStart(6),
        cell(b.vti).padStart(7),
        cell(b.vte).padStart(7),
        cell(b.ti, 2).padStart(6),
        cell(b.te, 2).padStart(6),
      ].join(" "),
    );
  }
  if (r.alarms.length) {
    lines.push("");
    lines.push("alarms:");
    for (const a of r.alarms) lines.push(`  ${a.t.toFixed(2).padStart(7)} s  ${a.kind}: ${a.message}`);
  }
  return lines.join("\n") + "\n";
}

function writeWaveform(file: string, r: SimResult): void {
  const w = r.waveforms;
  const rows: string[] = ["t_s,paw_cmH2O,flow_L_per_min,volume_mL,pmus_cmH2O,arm_deg,step"];
  for (let i = 0; i < w.t.length; i++) {
    rows.push(
      `${w.t[i].toFixed(4)},${w.paw[i].toFixed(4)},${w.flow[i].toFixed(4)},${w.volume[i].toFixed(3)},${w.pmus[i].toFixed(4)},${w.arm[i].toFixed(3)},${r.stepNames[w.step[i]]}`,
    );
  }
  try {
    writeFileSync(file, rows.join("\n") + "\n");
  } catch (e) {
    throw new CliError(`cannot write waveform file "${file}": ${(e as NodeJS.ErrnoException).code ?? (e as Error).message}`);
  }
}

function number(opt: string, text: string | undefined, q: Quantity): number | undefined {
  return text === undefined ? undefined : quantity(opt, text, q);
}

function main(): void {
  const a = parseArgs(process.argv.slice(2));
  let definition: SequenceDefinition;
  let name: string;
  if (a.template) {
    const t = getTemplate(a.template);
    if (!t) throw new CliError(`unknown template "${a.template}" (templates: ${TEMPLATE_IDS.join(", ")})`);
    definition = t.definition;
    name = t.title;
  } else {
    definition = readJson(a.definition as string, "definition") as SequenceDefinition;
    name = typeof definition?.name === "string" ? definition.name : (a.definition as string);
  }
  const settings =
    definition && typeof definition === "object" && definition.settings && typeof definition.settings === "object"
      ? buildSettings(definition, a.set)
      : {};
  const { patient, effortSeed } = buildPatient(a);
  const rig: RigInput | "ideal" = a.circuit === "ideal" && !a.rig ? "ideal" : a.rig ? (readJson(a.rig, "rig") as RigInput) : DEFAULT_RIG;
  const result = simulate({
    definition,
    settings,
    patient,
    rig,
    durationS: positive("--duration", quantity("--duration", a.duration, "time"), "duration"),
    dtS: number("--dt", a.dt, "time"),
    scanS: number("--scan", a.scan, "time"),
    seed: a.seed === undefined ? undefined : integer("--seed", a.seed),
    effortSeed,
  });
  if (a.waveform) writeWaveform(a.waveform, result);
  process.stdout.write(a.json ? JSON.stringify(jsonOutput(result)) + "\n" : tableOutput(result, name));
}

try {
  main();
} catch (e) {
  if (e instanceof CliError || e instanceof SimError || e instanceof SequenceError || e instanceof UnitError) {
    process.stderr.write(`sim: ${e.message}\n`);
    process.exit(2);
  }
  process.stderr.write(`sim: unexpected failure: ${e instanceof Error ? (e.stack ?? e.message) : String(e)}\n`);
  process.exit(1);
}
