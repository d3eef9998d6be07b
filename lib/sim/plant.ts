/**
 * The plant: lung + circuit node + driver + patient effort + sensors, advanced at the physics step.
 * The step loop calls one function per model part (lung.ts, circuit.ts, drivers.ts, effort.ts, sensors.ts)
 * and records the waveforms into preallocated typed arrays: no allocation per step. Two hot pieces are
 * written out in the loop with the same operations as their functions (the linear lung's recoil and the
 * circuit node's first Newton step); doubles cross calls only through typed arrays, never as arguments or
 * return values of functions V8 does not inline (each would be boxed in a fresh heap number).
 */
import { elasticPressureCmH2O, localElastanceCmH2OPerL, lungAdmittanceLpsPerCmH2O } from "./lung";
import {
  LEAK_NONE,
  NODE_BACK,
  NODE_DT,
  NODE_G,
  NODE_IO_LENGTH,
  NODE_PAW,
  NODE_QIN,
  reliefValveFlowLps,
  solveCircuitNodeCmH2O,
  type CircuitParams,
} from "./circuit";
import {
  BAG_PRESSURE_GAIN_LPS_PER_CMH2O,
  CMD_ARM,
  CMD_FLOW,
  CMD_HOLD,
  CMD_PRESSURE,
  CMD_RELEASE,
  bagSlopeHintedLPerDeg,
  bagVolumeHintedL,
  pulseRateForFlowHz,
  risePressureCmH2O,
  slewPulseRateHz,
  type BagTable,
} from "./drivers";
import { fillEffortPmusCmH2O, type EffortSchedule } from "./effort";
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
const slopeAt = bagSlopeHintedLPerDeg;
const bagVolume = bagVolumeHintedL;
const rateForFlow = pulseRateForFlowHz;
const rise = risePressureCmH2O;
const slew = slewPulseRateHz;
const fillPmus = fillEffortPmusCmH2O;
const lag = firstOrderLag;
const PRESSURE_GAIN = BAG_PRESSURE_GAIN_LPS_PER_CMH2O;
const K_RELEASE = CMD_RELEASE;
const K_FLOW = CMD_FLOW;
const K_PRESSURE = CMD_PRESSURE;
const K_ARM = CMD_ARM;
const IO_PAW = NODE_PAW;
const IO_DT = NODE_DT;
const IO_QIN = NODE_QIN;
const IO_G = NODE_G;
const IO_BACK = NODE_BACK;
const NO_LEAK = LEAK_NONE;

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
  // Every numeric field starts as a number, never `undefined` (an uninitialised class field is defined as
  // undefined first under ES2022 semantics): a field that once held undefined has V8's tagged
  // representation, and each store of a double into it allocates a heap number (per run() call: measured
  // ~2 MB of garbage per 60 s run). Fields that only ever hold numbers are stored in place.
  volumeL = 0;
  pawCmH2O = 0;
  flowLps = 0;
  pmusCmH2O = 0;
  armDeg = 0;
  pulseRateHz = 0;
  // Sensor filters (lagged, before noise and quantisation).
  pawLaggedCmH2O = 0;
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
  private readonly aPaw: number = 0;
  private readonly aFlow: number = 0;
  private readonly gLinear: number = 0;
  /** In/out slots of the circuit-node solver (circuit.ts NODE_*): doubles passed without boxing. */
  private readonly nodeIo = new Float64Array(NODE_IO_LENGTH);
  private pmusBuf = new Float64Array(16);
  /** Bag-table segments found last (drivers.ts bag*Hinted): 0 for the volume lookups, 1 for the slope. */
  private readonly bagHints = new Int32Array(2);

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

  /** Advance n physics steps from t0 (s). */
  run(t0S: number, n: number): void {
    const p = this.p;
    const dt = p.dtS;
    const lung = p.lung;
    const circ = p.circuit;
    const drv = p.driver;
    // Everything the loop reads that cannot change during a run (the controller changes commands and
    // accumulators only between runs), hoisted into locals: the loop then works on registers and the
    // typed arrays, with no property loads or calls it does not need.
    const p0 = lung.p0CmH2O;
    const e1 = lung.e1CmH2OPerL;
    const e2 = lung.e2CmH2OPerL2;
    const rLung = lung.resistanceCmH2OPerLps;
    const linear = e2 === 0;
    const gLinear = this.gLinear;
    const ideal = drv.ideal;
    const bag = drv.bag;
    const pulsesPerDegree = drv.pulsesPerDeg;
    const maxRate = drv.maxPulseRateHz;
    const maxAccel = drv.maxAccelHzPerS;
    const armTravel = drv.armTravelDeg;
    const returnStep = drv.returnSpeedDegPerS * dt;
    const reliefOpen = circ.reliefOpenCmH2O;
    const reliefR = circ.reliefResistanceCmH2OPerLps;
    // The circuit node's constants, for the written-out first Newton step below (no leak).
    const nodeInline = circ.leakKind === NO_LEAK;
    const cdt = circ.complianceLPerCmH2O / dt;
    const peepValve = circ.peepValveCmH2O;
    const rExp = circ.expiratoryResistanceCmH2OPerLps;
    const invExp = 1 / rExp;
    const invRelief = 1 / reliefR;
    const inletBelow = -circ.inletCrackingCmH2O;
    const rInlet = circ.inletResistanceCmH2OPerLps;
    const invInlet = 1 / rInlet;
    const aPaw = this.aPaw;
    const aFlow = this.aFlow;
    const kind = this.cmdKind;
    const valveOpen = kind === K_RELEASE;
    const cmdStart = this.cmdStartS;
    const cmdStartPaw = this.cmdStartCmH2O;
    const cmdTarget = this.cmdTargetCmH2O;
    const cmdRise = this.cmdRiseS;
    const cmdFlow = this.cmdFlowLps;
    const cmdAngle = this.cmdAngleDeg;
    const cmdRate = this.cmdPulseRateHz;
    const armStop = kind === K_ARM ? Math.min(cmdAngle, armTravel) : armTravel;
    const idealPressure = ideal && kind === K_PRESSURE;
    const idealFlow = ideal && kind === K_FLOW;
    const bagDriven = !ideal || kind === K_ARM || kind === K_RELEASE;
    const stepCode = this.stepCode;
    const waveT = this.wave.t;
    const wavePaw = this.wave.paw;
    const waveFlow = this.wave.flow;
    const waveVolume = this.wave.volume;
    const wavePmus = this.wave.pmus;
    const waveArm = this.wave.arm;
    const waveStep = this.wave.step;
    const io = this.nodeIo;
    const hints = this.bagHints;
    io[IO_DT] = dt;
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
    // Patient effort at the mid-point of each step of this run, filled by a small loop of its own.
    if (this.pmusBuf.length < n) this.pmusBuf = new Float64Array(n);
    const pmusBuf = this.pmusBuf;
    this.effortCursor = fillPmus(p.effort, this.effortCursor, t0S, dt, n, pmusBuf);
    // Bag volume at the current arm angle, carried from one step to the next (the table lookup of the
    // previous step's end angle is this step's start angle).
    let bagAtArm = NaN;

    for (let i = 0; i < n; i++) {
      const t1 = t0S + (i + 1) * dt;
      pmus = pmusBuf[i];
      // Lung, linearised over the step.
      // A linear lung's recoil is P0 + E1·V: lung.ts's E2·max(V, 0)² term is +0 then, and adding +0 changes
      // no value (bar the sign of a zero), so it is left off the step's critical path.
      const pel = linear ? p0 + e1 * v : elastic(v, p0, e1, e2);
      const g = linear ? gLinear : admittance(dt, elastance(v, e1, e2), rLung);
      const back = pel - pmus;
      // Driver.
      let qIn = 0;
      let pawNext: number;
      // Pressure the lung sees over the step (the ideal pressure source's ramp averaged over the step,
      // exact for a linear rise: second-order accurate where the end value would lag by dt/2).
      let pawStep: number;
      if (idealPressure) {
        pawNext = rise(t1, cmdStart, cmdStartPaw, cmdTarget, cmdRise);
        pawStep = 0.5 * (pawNext + rise(t1 - dt, cmdStart, cmdStartPaw, cmdTarget, cmdRise));
      } else {
        if (idealFlow) {
          qIn = cmdFlow > 0 ? cmdFlow : 0;
        } else if (bagDriven) {
          // Bag compressor (the ideal circuit uses it only for explicit arm commands, without rate limits).
          let target = 0;
          if (kind === K_FLOW) {
            target = rateForFlow(cmdFlow, slopeAt(bag, arm, hints, 1), pulsesPerDegree);
          } else if (kind === K_PRESSURE) {
            const ref = rise(t1, cmdStart, cmdStartPaw, cmdTarget, cmdRise);
            const demand = PRESSURE_GAIN * (ref - pawLag);
            target = rateForFlow(demand, slopeAt(bag, arm, hints, 1), pulsesPerDegree);
          } else if (kind === K_ARM) {
            target = arm < cmdAngle ? cmdRate : 0;
          }
          if (kind === K_RELEASE) {
            rate = 0;
            arm = arm > returnStep ? arm - returnStep : 0;
            bagAtArm = NaN;
          } else {
            rate = ideal ? Math.min(target, maxRate) : slew(rate, target, maxAccel, maxRate, dt);
            let armNext = arm + (rate / pulsesPerDegree) * dt;
            if (armNext >= armStop) {
              armNext = Math.max(arm, armStop);
              rate = 0;
            }
            // One-way valve: the bag only pushes.
            if (bagAtArm !== bagAtArm) bagAtArm = bagVolume(bag, arm, hints, 0);
            const bagNext = bagVolume(bag, armNext, hints, 0);
            const dv = bagNext - bagAtArm;
            qIn = dv > 0 ? dv / dt : 0;
            arm = armNext;
            bagAtArm = bagNext;
          }
        }
        // Circuit node. Without a leak every path is linear between the valves' kinks, and circuit.ts's
        // solver takes one Newton step from the previous Paw and stops there when the same paths conduct at
        // the result (it is then the root exactly) — the usual case, by far. That step is written out here,
        // with the same operations in the same order (so the same bits), because a call per step to the
        // whole solver costs about a tenth of the engine's time; anything else (a valve opening or closing
        // within the step, no bracket, a leak) goes to the solver, which starts from the same step.
        let solved = false;
        pawNext = paw;
        if (nodeInline) {
          const x = paw;
          // circuit.ts: cdt·(x − pawPrev) + g·(x − back) − qIn, where x = pawPrev makes the first term +0.
          let res = g * (x - back) - qIn;
          let slope = cdt + g;
          let active = 0;
          if (valveOpen && x > peepValve) {
            res += (x - peepValve) / rExp;
            slope += invExp;
            active = 1;
          }
          if (x > reliefOpen) {
            res += (x - reliefOpen) / reliefR;
            slope += invRelief;
            active |= 2;
          }
          if (x < inletBelow) {
            res -= (inletBelow - x) / rInlet;
            slope += invInlet;
            active |= 8;
          }
          if (res === 0) {
            solved = true;
          } else {
            const next = x - res / slope;
            // The solver's bracket after its first evaluation: (−∞, x) when the residual is positive, else (x, ∞).
            if (res > 0 ? next > -Infinity && next < x : next > x && next < Infinity) {
              let at = 0;
              if (valveOpen && next > peepValve) at = 1;
              if (next > reliefOpen) at |= 2;
              if (next < inletBelow) at |= 8;
              if (at === active) {
                pawNext = next;
                solved = true;
              }
            }
          }
        }
        if (!solved) {
          io[IO_PAW] = paw;
          io[IO_QIN] = qIn;
          io[IO_G] = g;
          io[IO_BACK] = back;
          solveNode(io, circ, valveOpen);
          pawNext = io[IO_PAW];
        }
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
      const qRelief = reliefFlow(paw, reliefOpen, reliefR);
      if (qRelief > 0) relief += qRelief * dt;
      // Sensors (lag only; noise and quantisation when the controller samples).
      pawLag = lag(pawLag, paw, aPaw);
      flowLag = lag(flowLag, flow * 60, aFlow);
      // Record.
      counter++;
      if (counter >= every && samples < cap) {
        counter = 0;
        waveT[samples] = t1;
        wavePaw[samples] = paw;
        waveFlow[samples] = flow * 60;
        waveVolume[samples] = v * 1000;
        wavePmus[samples] = pmus;
        waveArm[samples] = arm;
        waveStep[samples] = stepCode;
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
