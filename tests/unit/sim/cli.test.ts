/** The CLI contract (issue 3 §6), spawned as users and outside checks run it. */
import { spawnSync } from "node:child_process";
import { mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { describe, expect, it } from "vitest";

const root = path.resolve(__dirname, "../../..");
function sim(args: string[]) {
  const r = spawnSync(process.execPath, ["--import", "tsx", "lib/cli/sim.ts", ...args], { cwd: root, encoding: "utf8", timeout: 60000 });
  return { code: r.status, stdout: r.stdout, stderr: r.stderr };
}

describe("npm run sim", () => {
  it('"Done when": ISO row 1 on the ideal circuit gives Vti 490.8 mL ± 0.5 % and PIP 15 (ISO 80601-2-12:2020 Table 201.105 row 1, transcribed; Vti = C·ΔP·(1 − e^(−Ti/τ)), derived)', () => {
    const r = sim(
      "--template pressure-control --set PEEP=5 --set Pinsp=10 --set RR=20 --set Ti=1 --set rise=0 --lung C=50 --lung R=5 --circuit ideal --duration 30 --json".split(" "),
    );
    expect(r.stderr).toBe("");
    expect(r.code).toBe(0);
    const out = JSON.parse(r.stdout);
    expect(Object.keys(out)).toEqual(["summary", "breaths", "alarms"]);
    expect(Object.keys(out.summary)).toEqual([
      "pip", "pplat", "peep", "vti", "vte", "rr", "ie", "minuteVolume", "breaths", "triggerLatencyMs",
      "asynchronyIndex", "ineffectiveEfforts", "doubleTriggers", "autoTriggers",
    ]);
    expect(out.breaths.length).toBe(10);
    for (const b of out.breaths) {
      expect(Object.keys(b)).toEqual(["start", "trigger", "effortOnset", "latencyMs", "pip", "pplat", "peep", "vti", "vte", "ti", "te"]);
      expect(Math.abs(b.vti - 490.8) / 490.8).toBeLessThan(0.005);
      expect(b.pip).toBeCloseTo(15, 6);
      expect(b.trigger).toBe("timer");
      expect(b.pplat).toBeNull();
      expect(b.latencyMs).toBeNull();
    }
    expect(out.summary.rr).toBeCloseTo(20, 6);
    expect(out.summary.triggerLatencyMs).toEqual({ mean: null, p95: null, max: null, n: 0 });
  });

  it("accepts units (hPa, mL/hPa, psi), writes a waveform CSV and prints a table without --json", () => {
    const dir = mkdtempSync(path.join(tmpdir(), "tw-sim-"));
    const csv = path.join(dir, "w.csv");
    const r = sim([
      "--template", "assist-pressure", "--set", "PEEP=0.1 psi", "--set", "Pinsp=10 hPa", "--lung", "C=50 mL/hPa", "--lung", "R=5 hPa/(L/s)",
      "--effort", "shape=half-sine", "--effort", "amplitude=6", "--effort", "rate=15", "--effort", "ti=0.8 s", "--effort", "onset=1",
      "--duration", "10", "--waveform", csv,
    ]);
    expect(r.stderr).toBe("");
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/PIP .* cmH2O/);
    const lines = readFileSync(csv, "utf8").trim().split("\n");
    expect(lines[0]).toBe("t_s,paw_cmH2O,flow_L_per_min,volume_mL,pmus_cmH2O,arm_deg,step");
    expect(lines.length).toBe(10001);
    // PEEP 0.1 psi = 7.03 cmH2O (derived): the circuit rests there before the first breath ends.
    expect(Number(lines[lines.length - 1].split(",")[1])).toBeGreaterThan(6);
  });

  const bad: Array<[string, string[], RegExp]> = [
    ["unknown template", ["--template", "nope"], /unknown template "nope"/],
    ["bad unit", ["--template", "pressure-control", "--lung", "C=3 mL"], /expected a compliance/],
    ["negative compliance", ["--template", "pressure-control", "--lung", "C=-5"], /compliance must be above 0/],
    ["setting out of bounds", ["--template", "pressure-control", "--set", "PEEP=80"], /PEEP.*above its maximum/],
    ["unknown option", ["--template", "pressure-control", "--frobnicate"], /unknown option/],
    // The sensitivity's unit follows the trigger (unitBy), whatever the order of the --set options.
    ["sensitivity in a pressure unit with a flow trigger", ["--template", "assist-pressure", "--set", "sensitivity=2 hPa", "--set", "trigger=flow"], /sensitivity: expected a flow/],
  ];
  for (const [what, args, msg] of bad) {
    it(`exits 2 with a message for bad input: ${what}`, () => {
      const r = sim(args);
      expect(r.code).toBe(2);
      expect(r.stderr).toMatch(msg);
      expect(r.stdout).toBe("");
    });
  }

  it("exits 2 for an invalid definition and for a zero-time loop between steps", () => {
    const dir = mkdtempSync(path.join(tmpdir(), "tw-sim-"));
    const invalid = path.join(dir, "invalid.json");
    writeFileSync(invalid, JSON.stringify({ format: "tidewright.sequence/1", name: "x", settings: {}, machine: { id: "m", initial: "a", states: { a: { meta: { kind: "inhale", command: { kind: "hold" } }, after: { "1": { target: "b" } } } } } }));
    let r = sim(["--definition", invalid]);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/machine\.states\.a\.after\.1\[0\]\.target: .*unknown target step "b"/);
    const loop = path.join(dir, "loop.json");
    writeFileSync(
      loop,
      JSON.stringify({
        format: "tidewright.sequence/1",
        name: "loop",
        settings: {},
        machine: {
          id: "m",
          initial: "up",
          states: {
            up: { meta: { kind: "inhale", command: { kind: "hold" } }, after: { "0": { target: "down" } } },
            down: { meta: { kind: "exhale", command: { kind: "release" } }, after: { "0": { target: "up" } } },
          },
        },
      }),
    );
    r = sim(["--definition", loop]);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/without time passing/);
    expect(r.stderr).toMatch(/up/);
    expect(r.stderr).toMatch(/down/);
  });
});
