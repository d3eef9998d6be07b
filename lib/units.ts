/**
 * Values with units, parsed through mathjs (its unit library has cmH2O, hPa, psi, mL, L, min, s…) and
 * converted to the product's canonical units: pressure cmH2O, volume mL, flow L/min, time s, rate /min,
 * resistance cmH2O/(L/s), compliance mL/cmH2O. A bare number is already canonical.
 *
 * Input is user text, so it is parsed and checked node by node (numbers, unit names, * / ^ and
 * parentheses only) before evaluation: no functions, no assignments, no symbols but units.
 */
import { all, create, type MathNode, type Unit } from "mathjs";

export class UnitError extends Error {
  constructor(message: string) {
    super(message);
    this.name = "UnitError";
  }
}

const math = create(all);
const parse = math.parse;

export const QUANTITIES = {
  pressure: { canonical: "cmH2O", label: "a pressure" },
  volume: { canonical: "mL", label: "a volume" },
  flow: { canonical: "L/min", label: "a flow" },
  time: { canonical: "s", label: "a time" },
  rate: { canonical: "min^-1", label: "a rate" },
  resistance: { canonical: "cmH2O/(L/s)", label: "a resistance" },
  compliance: { canonical: "mL/cmH2O", label: "a compliance" },
  elastance: { canonical: "cmH2O/L", label: "an elastance" },
  angle: { canonical: "deg", label: "an angle" },
  frequency: { canonical: "Hz", label: "a frequency" },
  // The rig profile's actuator limits: arm return speed and how fast the step pulse rate may ramp.
  angularSpeed: { canonical: "deg/s", label: "an angular speed" },
  pulseAcceleration: { canonical: "Hz/s", label: "a pulse-rate acceleration" },
  length: { canonical: "cm", label: "a length" },
  mass: { canonical: "kg", label: "a mass" },
  dimensionless: { canonical: "", label: "a plain number" },
} as const;
export type Quantity = keyof typeof QUANTITIES;

/** Canonical unit text as shown to users ("/min" rather than mathjs's "1/min"). */
export function canonicalUnitLabel(q: Quantity): string {
  return q === "rate" ? "/min" : QUANTITIES[q].canonical;
}

/** The quantity a setting's unit string stands for, or null if we do not convert it. */
export function quantityOfUnit(unit: string): Quantity | null {
  const u = unit.replace(/\s+/g, "");
  switch (u) {
    case "cmH2O":
      return "pressure";
    case "mL":
      return "volume";
    case "L/min":
      return "flow";
    case "s":
      return "time";
    case "/min":
    case "1/min":
    case "bpm":
      return "rate";
    case "cmH2O/(L/s)":
      return "resistance";
    case "mL/cmH2O":
      return "compliance";
    case "deg":
      return "angle";
    case "Hz":
      return "frequency";
    case "":
    case "%":
      return "dimensionless";
    default:
      return null;
  }
}

const ALLOWED_OPS = new Set(["multiply", "divide", "pow", "unaryMinus", "unaryPlus"]);

function checkNode(n: MathNode, text: string): void {
  const node = n as unknown as { type: string; fn?: string; args?: MathNode[]; content?: MathNode; name?: string; value?: unknown };
  switch (node.type) {
    case "ConstantNode":
      if (typeof node.value !== "number") throw new UnitError(`"${text}" is not a number with a unit`);
      return;
    case "SymbolNode":
      if (!math.Unit.isValuelessUnit(node.name as string)) throw new UnitError(`unknown unit "${node.name}" in "${text}"`);
      return;
    case "ParenthesisNode":
      checkNode(node.content as MathNode, text);
      return;
    case "OperatorNode":
      if (!ALLOWED_OPS.has(node.fn as string)) throw new UnitError(`"${text}" is not a number with a unit`);
      for (const a of node.args ?? []) checkNode(a, text);
      return;
    default:
      throw new UnitError(`"${text}" is not a number with a unit`);
  }
}

type Value = number | Unit;

/**
 * Evaluate a checked tree. Symbols are always units: mathjs's own evaluation would resolve `min` to the
 * min() function before the minute ("20 /min").
 */
function evalNode(n: MathNode): Value {
  const node = n as unknown as { type: string; fn?: string; args?: MathNode[]; content?: MathNode; name?: string; value?: unknown };
  switch (node.type) {
    case "ConstantNode":
      return node.value as number;
    case "SymbolNode":
      return math.unit(node.name as string);
    case "ParenthesisNode":
      return evalNode(node.content as MathNode);
    default: {
      const args = (node.args ?? []).map(evalNode);
      switch (node.fn) {
        case "multiply":
          return math.multiply(args[0], args[1]) as Value;
        case "divide":
          return math.divide(args[0], args[1]) as Value;
        case "pow":
          return math.pow(args[0] as Unit, args[1] as number) as Value;
        case "unaryMinus":
          return math.unaryMinus(args[0]) as Value;
        default:
          return args[0];
      }
    }
  }
}

function describeUnit(u: Unit): string {
  for (const [q, info] of Object.entries(QUANTITIES)) {
    if (q !== "dimensionless" && info.canonical && u.equalBase(math.unit(info.canonical))) return info.label.replace(/^an? /, "");
  }
  return "a different kind of unit";
}

/** Evaluate unit text to a mathjs value: a number (no unit) or a Unit. */
function evaluateText(text: string): number | Unit {
  let node: MathNode;
  try {
    node = parse(text);
  } catch {
    throw new UnitError(`cannot read "${text}" as a number with a unit`);
  }
  checkNode(node, text);
  const v = evalNode(node);
  if (typeof v === "number") return v;
  if (math.isUnit(v)) return v as Unit;
  throw new UnitError(`cannot read "${text}" as a number with a unit`);
}

/**
 * Parse a value for a quantity: "0.1 psi" → 7.0307 (cmH2O), "3 mL/hPa" → 2.942 (mL/cmH2O), "20 /min" → 20.
 * Bare numbers (number or numeric text) are taken as canonical. Throws UnitError naming the problem.
 */
export function parseQuantity(value: string | number, quantity: Quantity): number {
  if (typeof value === "number") {
    if (!Number.isFinite(value)) throw new UnitError(`expected ${QUANTITIES[quantity].label}, got ${value}`);
    return value;
  }
  let text = value.trim();
  if (text === "") throw new UnitError(`expected ${QUANTITIES[quantity].label}, got nothing`);
  if (quantity === "dimensionless" && text.endsWith("%")) text = text.slice(0, -1).trim();
  const bare = Number(text);
  if (text !== "" && Number.isFinite(bare)) return bare;
  const v = evaluateText(text);
  const canonical = QUANTITIES[quantity].canonical;
  if (typeof v === "number") return v;
  if (!canonical) throw new UnitError(`expected ${QUANTITIES[quantity].label}, got "${value}"`);
  const target = math.unit(canonical);
  if (!v.equalBase(target)) {
    throw new UnitError(`expected ${QUANTITIES[quantity].label} (${canonicalUnitLabel(quantity)}), got ${value.trim()} (${describeUnit(v)})`);
  }
  // Round away binary noise of the unit factors (500 mL → 500.00000000000006 otherwise).
  const n = Number(v.toNumber(canonical).toPrecision(12));
  if (!Number.isFinite(n)) throw new UnitError(`expected ${QUANTITIES[quantity].label}, got ${value}`);
  return n;
}

/** Parse a value for a setting by its unit string; unknown unit strings take bare numbers only. */
export function parseSettingValue(value: string | number, unit: string): number {
  const q = quantityOfUnit(unit);
  if (q) return parseQuantity(value, q);
  if (typeof value === "number") return value;
  const n = Number(value.trim());
  if (value.trim() === "" || !Number.isFinite(n)) {
    throw new UnitError(`expected a number in ${unit}, got "${value}"`);
  }
  return n;
}

/** Convert a canonical value to another unit for display ("cmH2O" → "hPa"). */
export function convertFromCanonical(valueCanonical: number, quantity: Quantity, toUnit: string): number {
  const canonical = QUANTITIES[quantity].canonical;
  if (!canonical) return valueCanonical;
  return math.unit(valueCanonical, canonical).toNumber(toUnit);
}
