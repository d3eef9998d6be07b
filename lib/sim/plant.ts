/**
 * The plant: lung + circuit node + driver + patient effort + sensors, advanced at the physics step.
 * The step loop calls one function per model part (lung.ts, circuit.ts, drivers.ts, effort.ts, sensors.ts)
 * and records the waveforms into preallocated typed arrays: no allocation per step.
 */
import { elasticPressureCmH2O, localElastanceCmH2OPerL, lungAdmittanceLpsPerCmH2O } from "./lung";
import { reliefValveFlowLps, solveCircuitNodeCmH2O, type CircuitParams } from "./circuit";
import {
  BAG_PRESSURE_GAIN_LPS_PER_CMH2O,
  CMD_ARM,
  CMD_FLOW,
  CMD_HOLD,
  CMD_PRESSURE,
  CMD_RELEASE,
  bagSlopeLPerDeg,
  bagVolumeL,
  pulseRateForFlowHz,
  risePressureCmH2O,
  slewPulseRateHz,
  type BagTable,
} from "./drivers";
import { effortPmusCmH2O, type EffortSchedule } from "./effort";
import { firstOrderLag, lagFactor } from "./sensors";
import type { Waveforms } from "./types";

// Local bindings of the model functions: when this file is compiled to CommonJS (tsx, the CLI), imported
// names become property getters on the module object, which V8 does not inline in the step loop (measured:
// ~3× slower and boxed doubles for the GC). One read at load time keeps the loop on direct calls.
const elastic = elasticPressureCmH2O;
const elastance = localElastanceCmH2OPerL;
const admittance = lungAdmittanceLpsPerCmH2O;
const reliefFlow = reliefValveFlowLps;
const solveNode = solveCircuitNodeCmH2O;
const slopeAt = bagSlopeLPerDeg;
const bagVolume = bagVolumeL;
const rateForFlow = pulseRateForFlowHz;
const rise = risePressureCmH2O;
const slew = slewPulseRateHz;
const pmusAt = effortPmusCmH2O;
const lag = firstOrderLag;
const PRESSURE_GAIN = BAG_PRESSURE_GAIN_LPS_PER_CMH2O;
const K_RELEASE = CMD_RELEASE;
const K_FLOW = CMD_FLOW;
const K_PRESSURE = CMD_PRESSURE;
const K_ARM = CMD_ARM;

export interface LungParams {
  /** Pressure at the reference volume (V = 0), cmH2O: the end-expiratory pressure the run starts at. */
  p0CmH2O: number;
  e1CmH2OPerL: number;
  e2CmH2OPerL2: number;
  resistanceCmH2OPerLps: number;
}

export interface DriverParams {
  /** Ideal sources (flow, pressure) instead of the bag compressor. */
  ideal: boolean;
  pulsesPerDeg: number;
  maxPulseRateHz: number;
  maxAccelHzPerS: number;
  armTravelDeg: number;
  returnSpeedDegPerS: number;
  bag: BagTable;
}

export interface SensorParams {
  pressureLagS: number;
  flowLagS: number;
}

export interface PlantParams {
  dtS: number;
  lung: LungParams;
  circuit: CircuitParams;
  driver: DriverParams;
  sensors: SensorParams;
  effort: EffortSchedule;
  sampleEvery: number;
  capacity: number;
}

export class Plant {
  readonly p: PlantParams;
  // True state.
  volumeL = 0;
  pawCmH2O: number;
  flowLps = 0;
  pmusCmH2O = 0;
  armDeg = 0;
  pulseRateHz = 0;
  // Sensor filters (lagged, before noise and quantisation).
  pawLaggedCmH2O: number;
  flowLaggedLpm = 0;
  // Command.
  cmdKind = CMD_RELEASE;
  cmdFlowLps = 0;
  cmdTargetCmH2O = 0;
  cmdRiseS = 0;
  cmdStartS = 0;
  cmdStartCmH2O = 0;
  cmdAngleDeg = 0;
  cmdPulseRateHz = 0;
  /** Index of the active step, recorded with each sample. */
  stepCode = 0;
  // Breath accumulators (reset by the controller at each breath start).
  inspiratory = false;
  accPipCmH2O = -Infinity;
  accVtiL = 0;
  accVteL = 0;
  accPeakFlowLps = 0;
  accReliefL = 0;
  // Recording.
  readonly wave: Waveforms;
  samples = 0;
  private stepCounter = 0;
  private effortCursor = -1;
  private readonly aPaw: number;
  private readonly aFlow: number;
  private readonly gLinear: number;
  private readonly scratch = new Float64Array(1);
  private pmusBuf = new Float64Array(16);

  constructor(p: PlantParams) {
    this.p = p;
    this.pawCmH2O = p.lung.p0CmH2O;
    this.pawLaggedCmH2O = p.lung.p0CmH2O;
    this.aPaw = lagFactor(p.dtS, p.sensors.pressureLagS);
    this.aFlow = lagFactor(p.dtS, p.sensors.flowLagS);
    this.gLinear = lungAdmittanceLpsPerCmH2O(p.dtS, p.lung.e1CmH2OPerL, p.lung.resistanceCmH2OPerLps);
    const n = p.capacity;
    this.wave = {
      t: new Float64Array(n),
      paw: new Float32Array(n),
      flow: new Float32Array(n),
      volume: new Float32Array(n),
      pmus: new Float32Array(n),
      arm: new Float32Array(n),
      step: new Uint16Array(n),
    };
  }

  /** Set the driver command from a step's entry (pressure rises from the current Paw). */
  setCommand(kind: number, tS: number, a = 0, b = 0): void {
    this.cmdKind = kind;
    this.cmdStartS = tS;
    this.cmdStartCmH2O = this.pawCmH2O;
    if (kind === CMD_FLOW) this.cmdFlowLps = a;
    else if (kind === CMD_PRESSURE) {
      this.cmdTargetCmH2O = a;
      this.cmdRiseS = b;
    } else if (kind === CMD_ARM) {
      this.cmdAngleDeg = a;
      this.cmdPulseRateHz = b;
    }
  }

  resetBreath(): void {
    this.accPipCmH2O = this.pawCmH2O;
    this.accVtiL = 0;
    this.accVteL = 0;
    this.accPeakFlowLps = 0;
    this.accReliefL = 0;
  }

  /**
   * Patient effort at the mid-point of each of the next n steps. A small loop of its own, so the JIT inlines
   * the effort shape here instead of calling it (and boxing its result) from the long step loop.
   */
  private fillPmus(t0S: number, n: number): Float64Array {
    if (this.pmusBuf.length < n) this.pmusBuf = new Float64Array(n);
    const buf = this.pmusBuf;
    const eff = this.p.effort;
    const dt = this.p.dtS;
    let cursor = this.effortCursor;
    for (let i = 0; i < n; i++) {
      const tm = t0S + (i + 0.5) * dt;
      while (cursor + 1 < eff.count && eff.onsetS[cursor + 1] <= tm) cursor++;
      buf[i] = cursor >= 0 ? pmusAt(eff, cursor, tm) : 0;
    }
    this.effortCursor = cursor;
    return buf;
  }

  /** Advance n physics steps from t0 (s). */
  run(t0S: number, n: number): void {
    const p = this.p;
    const dt = p.dtS;
    const lung = p.lung;
    const circ = p.circuit;
    const drv = p.driver;
    const wave = this.wave;
    const linear = lung.e2CmH2OPerL2 === 0;
    const kind = this.cmdKind;
    const valveOpen = kind === K_RELEASE;
    let v = this.volumeL;
    let paw = this.pawCmH2O;
    let arm = this.armDeg;
    let rate = this.pulseRateHz;
    let pawLag = this.pawLaggedCmH2O;
    let flowLag = this.flowLaggedLpm;
    let flow = this.flowLps;
    let pmus = this.pmusCmH2O;
    let pip = this.accPipCmH2O;
    let vti = this.accVtiL;
    let vte = this.accVteL;
    let peakFlow = this.accPeakFlowLps;
    let relief = this.accReliefL;
    const insp = this.inspiratory;
    let samples = this.samples;
    let counter = this.stepCounter;
    const every = p.sampleEvery;
    const cap = p.capacity;
    const scratch = this.scratch;
    const pmusBuf = this.fillPmus(t0S, n);

    for (let i = 0; i < n; i++) {
      const t1 = t0S + (i + 1) * dt;
      pmus = pmusBuf[i];
      // Lung, linearised over the step.
      const pel = elastic(v, lung.p0CmH2O, lung.e1CmH2OPerL, lung.e2CmH2OPerL2);
      const g = linear
        ? this.gLinear
        : admittance(dt, elastance(v, lung.e1CmH2OPerL, lung.e2CmH2OPerL2), lung.resistanceCmH2OPerLps);
      const back = pel - pmus;
      // Driver.
      let qIn = 0;
      let pawNext: number;
      // Pressure the lung sees over the step (the ideal pressure source's ramp averaged over the step,
      // exact for a linear rise: second-order accurate where the end value would lag by dt/2).
      let pawStep: number;
      if (drv.ideal && kind === K_PRESSURE) {
        pawNext = rise(t1, this.cmdStartS, this.cmdStartCmH2O, this.cmdTargetCmH2O, this.cmdRiseS);
        pawStep = 0.5 * (pawNext + rise(t1 - dt, this.cmdStartS, this.cmdStartCmH2O, this.cmdTargetCmH2O, this.cmdRiseS));
      } else {
        if (drv.ideal && kind === K_FLOW) {
          qIn = this.cmdFlowLps > 0 ? this.cmdFlowLps : 0;
        } else if (!drv.ideal || kind === K_ARM || kind === K_RELEASE) {
          // Bag compressor (the ideal circuit uses it only for explicit arm commands, without rate limits).
          let target = 0;
          if (kind === K_FLOW) {
            target = rateForFlow(this.cmdFlowLps, slopeAt(drv.bag, arm), drv.pulsesPerDeg);
          } else if (kind === K_PRESSURE) {
            const ref = rise(t1, this.cmdStartS, this.cmdStartCmH2O, this.cmdTargetCmH2O, this.cmdRiseS);
            const demand = PRESSURE_GAIN * (ref - pawLag);
            target = rateForFlow(demand, slopeAt(drv.bag, arm), drv.pulsesPerDeg);
          } else if (kind === K_ARM) {
            target = arm < this.cmdAngleDeg ? this.cmdPulseRateHz : 0;
          }
          if (kind === K_RELEASE) {
            rate = 0;
            arm = arm > drv.returnSpeedDegPerS * dt ? arm - drv.returnSpeedDegPerS * dt : 0;
          } else {
            rate = drv.ideal ? Math.min(target, drv.maxPulseRateHz) : slew(rate, target, drv.maxAccelHzPerS, drv.maxPulseRateHz, dt);
            let armNext = arm + (rate / drv.pulsesPerDeg) * dt;
            const stop = kind === K_ARM ? Math.min(this.cmdAngleDeg, drv.armTravelDeg) : drv.armTravelDeg;
            if (armNext >= stop) {
              armNext = Math.max(arm, stop);
              rate = 0;
            }
            // One-way valve: the bag only pushes.
            const dv = bagVolume(drv.bag, armNext) - bagVolume(drv.bag, arm);
            qIn = dv > 0 ? dv / dt : 0;
            arm = armNext;
          }
        }
        solveNode(scratch, paw, dt, circ, valveOpen, qIn, g, back);
        pawNext = scratch[0];
        pawStep = pawNext;
      }
      paw = pawNext;
      flow = g * (pawStep - back);
      v += flow * dt;
      // Metrics accumulators.
      if (paw > pip) pip = paw;
      if (insp) {
        if (flow > 0) vti += flow * dt;
        if (flow > peakFlow) peakFlow = flow;
      } else if (flow < 0) vte -= flow * dt;
      const qRelief = reliefFlow(paw, circ.reliefOpenCmH2O, circ.reliefResistanceCmH2OPerLps);
      if (qRelief > 0) relief += qRelief * dt;
      // Sensors (lag only; noise and quantisation when the controller samples).
      pawLag = lag(pawLag, paw, this.aPaw);
      flowLag = lag(flowLag, flow * 60, this.aFlow);
      // Record.
      counter++;
      if (counter >= every && samples < cap) {
        counter = 0;
        wave.t[samples] = t1;
        wave.paw[samples] = paw;
        wave.flow[samples] = flow * 60;
        wave.volume[samples] = v * 1000;
        wave.pmus[samples] = pmus;
        wave.arm[samples] = arm;
        wave.step[samples] = this.stepCode;
        samples++;
      }
    }
    this.volumeL = v;
    this.pawCmH2O = paw;
    this.flowLps = flow;
    this.pmusCmH2O = pmus;
    this.armDeg = arm;
    this.pulseRateHz = rate;
    this.pawLaggedCmH2O = pawLag;
    this.flowLaggedLpm = flowLag;
    this.accPipCmH2O = pip;
    this.accVtiL = vti;
    this.accVteL = vte;
    this.accPeakFlowLps = peakFlow;
    this.accReliefL = relief;
    this.samples = samples;
    this.stepCounter = counter;
  }
}

export { CMD_ARM, CMD_FLOW, CMD_HOLD, CMD_PRESSURE, CMD_RELEASE };
