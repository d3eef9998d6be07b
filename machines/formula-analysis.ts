/**
 * Static analysis of sequence formulas: parse (never evaluate with mathjs), list the names a formula
 * reads, infer its physical dimension, and bound its value over the settings' allowed ranges.
 *
 * Formulas see plain numbers in canonical units (schema.ts), so scale never matters here: a dimension
 * is an exponent vector over base quantities, and volume / time is a flow whatever the numbers are.
 * A bare literal (or an expression of literals only) adapts to whatever it meets, because `PEEP + 5`
 * means "5 cmH2O more" in a language without unit syntax.
 *
 * This module is the checks' core and the inspector's as-you-type validator; it depends only on the
 * mathjs parser and the schema, not on the engine's restricted compile.
 */
import { parse, type MathNode } from "mathjs";
import { SIGNALS, type Setting, type SignalName } from "@/machines/schema";

// ---------------------------------------------------------------------------------------------
// Dimensions
// ---------------------------------------------------------------------------------------------

/** Mass and length exist for settings such as predicted body weight (kg) and height (cm). */
export const BASE_QUANTITIES = ["pressure", "volume", "time", "angle", "mass", "length"] as const;
export type BaseQuantity = (typeof BASE_QUANTITIES)[number];
export type Exponents = Readonly<Record<BaseQuantity, number>>;

export type Dimension =
  | { kind: "quantity"; exponents: Exponents }
  | { kind: "boolean" }
  | { kind: "text" };
export type InferredDimension = Dimension | "unknown";

function exponents(partial: Partial<Record<BaseQuantity, number>>): Exponents {
  return { pressure: 0, volume: 0, time: 0, angle: 0, mass: 0, length: 0, ...partial };
}
function quantity(partial: Partial<Record<BaseQuantity, number>>): Dimension {
  return { kind: "quantity", exponents: exponents(partial) };
}

export const DIMENSIONS = {
  pressure: quantity({ pressure: 1 }),
  volume: quantity({ volume: 1 }),
  flow: quantity({ volume: 1, time: -1 }),
  time: quantity({ time: 1 }),
  frequency: quantity({ time: -1 }),
  angle: quantity({ angle: 1 }),
  mass: quantity({ mass: 1 }),
  length: quantity({ length: 1 }),
  dimensionless: quantity({}),
  compliance: quantity({ volume: 1, pressure: -1 }),
  resistance: quantity({ pressure: 1, time: 1, volume: -1 }),
  boolean: { kind: "boolean" } as Dimension,
  text: { kind: "text" } as Dimension,
} as const satisfies Record<string, Dimension>;

export function sameDimension(a: Dimension, b: Dimension): boolean {
  if (a.kind !== b.kind) return false;
  if (a.kind !== "quantity" || b.kind !== "quantity") return true;
  return BASE_QUANTITIES.every((q) => Math.abs(a.exponents[q] - b.exponents[q]) < 1e-9);
}

/** A name an engineer recognises: "pressure", "flow", "a condition", else a product of base quantities. */
export function describeDimension(d: InferredDimension): string {
  if (d === "unknown") return "an unknown quantity";
  if (d.kind === "boolean") return "a condition (true/false)";
  if (d.kind === "text") return "a text choice";
  for (const [name, known] of Object.entries(DIMENSIONS)) {
    if (known.kind === "quantity" && sameDimension(known, d)) {
      return name === "dimensionless" ? "a plain number" : `${/^[aeiou]/.test(name) ? "an" : "a"} ${name}`;
    }
  }
  const up: string[] = [];
  const down: string[] = [];
  for (const q of BASE_QUANTITIES) {
    const e = d.exponents[q];
    if (e === 0) continue;
    const power = Math.abs(e) === 1 ? "" : `^${Math.abs(e)}`;
    (e > 0 ? up : down).push(q + power);
  }
  return `a ${up.length ? up.join("·") : "1"}${down.length ? "/" + down.join("·") : ""} quantity`;
}

// ---------------------------------------------------------------------------------------------
// Units → dimensions
// ---------------------------------------------------------------------------------------------

/** Unit symbols a setting may carry. Scale variants (L, ms, min) share their canonical unit's dimension. */
const UNIT_SYMBOLS: Record<string, Dimension> = {
  cmH2O: DIMENSIONS.pressure,
  hPa: DIMENSIONS.pressure,
  mbar: DIMENSIONS.pressure,
  mL: DIMENSIONS.volume,
  L: DIMENSIONS.volume,
  s: DIMENSIONS.time,
  ms: DIMENSIONS.time,
  min: DIMENSIONS.time,
  deg: DIMENSIONS.angle,
  Hz: DIMENSIONS.frequency,
  bpm: DIMENSIONS.frequency,
  kg: DIMENSIONS.mass,
  cm: DIMENSIONS.length,
  m: DIMENSIONS.length,
  steps: DIMENSIONS.dimensionless,
  breaths: DIMENSIONS.dimensionless,
};

/**
 * Dimension of a unit string such as "cmH2O", "L/min", "/min", "mL/cmH2O" or "cmH2O/(L/s)";
 * null when a symbol is not one we know. The unit is parsed with the mathjs parser because unit
 * strings are products and quotients of symbols, which is exactly its grammar.
 */
export function dimensionOfUnit(unit: string): Dimension | null {
  const text = unit.trim();
  if (text === "" || text === "%") return DIMENSIONS.dimensionless;
  let node: MathNode;
  try {
    node = parse(text.startsWith("/") ? `1${text}` : text);
  } catch {
    return null;
  }
  const walk = (n: MathNode): Dimension | null => {
    const v = view(n);
    switch (v.type) {
      case "SymbolNode":
        return UNIT_SYMBOLS[v.name] ?? null;
      case "ConstantNode":
        return typeof v.value === "number" ? DIMENSIONS.dimensionless : null;
      case "ParenthesisNode":
        return walk(v.content);
      case "OperatorNode": {
        if ((v.fn === "multiply" || v.fn === "divide") && v.args.length === 2) {
          const [a, b] = v.args.map(walk);
          if (!a || !b || a.kind !== "quantity" || b.kind !== "quantity") return null;
          return combine(a, b, v.fn === "multiply" ? 1 : -1);
        }
        if (v.fn === "pow" && v.args.length === 2) {
          const base = walk(v.args[0]);
          const power = literalNumber(v.args[1]);
          if (!base || base.kind !== "quantity" || power === null) return null;
          return scale(base, power);
        }
        return null;
      }
      default:
        return null;
    }
  };
  return walk(node);
}

function combine(a: Dimension & { kind: "quantity" }, b: Dimension & { kind: "quantity" }, sign: 1 | -1): Dimension {
  const e: Partial<Record<BaseQuantity, number>> = {};
  for (const q of BASE_QUANTITIES) e[q] = a.exponents[q] + sign * b.exponents[q];
  return quantity(e);
}
function scale(a: Dimension & { kind: "quantity" }, power: number): Dimension {
  const e: Partial<Record<BaseQuantity, number>> = {};
  for (const q of BASE_QUANTITIES) e[q] = a.exponents[q] * power;
  return quantity(e);
}

// ---------------------------------------------------------------------------------------------
// A typed view of mathjs nodes (the published node types are loose; we narrow on `type` once here)
// ---------------------------------------------------------------------------------------------

type NodeView =
  | { type: "ConstantNode"; value: unknown }
  | { type: "SymbolNode"; name: string }
  | { type: "ParenthesisNode"; content: MathNode }
  | { type: "OperatorNode"; fn: string; op: string; args: MathNode[] }
  | { type: "FunctionNode"; fn: MathNode; args: MathNode[] }
  | { type: "ConditionalNode"; condition: MathNode; trueExpr: MathNode; falseExpr: MathNode }
  | { type: "RelationalNode"; conditionals: string[]; params: MathNode[] }
  | { type: "other"; nodeType: string };

const VIEWED = new Set([
  "ConstantNode",
  "SymbolNode",
  "ParenthesisNode",
  "OperatorNode",
  "FunctionNode",
  "ConditionalNode",
  "RelationalNode",
]);

function view(node: MathNode): NodeView {
  if (!VIEWED.has(node.type)) return { type: "other", nodeType: node.type };
  // The fields read for each type are the ones documented in mathjs' own node classes.
  return node as unknown as NodeView;
}

/** Numeric value of a literal-only expression such as `2`, `-0.5`, `1/3`, `(2)`; null otherwise. */
function literalNumber(node: MathNode): number | null {
  const v = view(node);
  if (v.type === "ConstantNode") return typeof v.value === "number" ? v.value : null;
  if (v.type === "ParenthesisNode") return literalNumber(v.content);
  if (v.type === "OperatorNode") {
    const args = v.args.map(literalNumber);
    if (args.some((a) => a === null)) return null;
    const [a, b] = args as number[];
    switch (v.fn) {
      case "unaryMinus":
        return -a;
      case "unaryPlus":
        return a;
      case "add":
        return a + b;
      case "subtract":
        return a - b;
      case "multiply":
        return a * b;
      case "divide":
        return a / b;
      default:
        return null;
    }
  }
  return null;
}

// ---------------------------------------------------------------------------------------------
// Parsing and names
// ---------------------------------------------------------------------------------------------

export interface FormulaSyntaxError {
  message: string;
  /** 0-based index into the formula where the parser gave up (mathjs reports it 1-based). */
  position: number | null;
}

export type ParseResult = { ok: true; ast: MathNode } | { ok: false; error: FormulaSyntaxError };

export function parseFormula(expr: string): ParseResult {
  try {
    return { ok: true, ast: parse(expr) };
  } catch (err) {
    return { ok: false, error: readableSyntaxError(err, expr) };
  }
}

function readableSyntaxError(err: unknown, expr: string): FormulaSyntaxError {
  const raw = err instanceof Error ? err.message : String(err);
  const charProp = typeof err === "object" && err !== null && "char" in err ? (err as { char: unknown }).char : null;
  const position = typeof charProp === "number" ? Math.max(0, charProp - 1) : null;
  const bare = raw.replace(/\s*\(char \d+\)\s*$/, "");
  const where =
    position === null
      ? ""
      : position >= expr.length
        ? " at the end of the formula"
        : ` at character ${position + 1} ("${expr.slice(position, position + 8)}")`;
  return { message: `${bare}${where}.`, position };
}

export interface FormulaNames {
  /** Names read as values (signals, settings, constants), in first-use order, without duplicates. */
  symbols: string[];
  /** Names called as functions. */
  functions: string[];
}

export function formulaNames(ast: MathNode): FormulaNames {
  const symbols: string[] = [];
  const functions: string[] = [];
  const visit = (node: MathNode): void => {
    const v = view(node);
    if (v.type === "SymbolNode") {
      if (!symbols.includes(v.name)) symbols.push(v.name);
      return;
    }
    if (v.type === "FunctionNode") {
      const fn = view(v.fn);
      if (fn.type === "SymbolNode") {
        if (!functions.includes(fn.name)) functions.push(fn.name);
      } else visit(v.fn);
      v.args.forEach(visit);
      return;
    }
    node.forEach((child) => visit(child));
  };
  visit(ast);
  return { symbols, functions };
}

/** Symbol names a formula reads (function names excluded); empty when it does not parse. */
export function formulaSymbols(expr: string): string[] {
  const parsed = parseFormula(expr);
  return parsed.ok ? formulaNames(parsed.ast).symbols : [];
}

// ---------------------------------------------------------------------------------------------
// Scope: what a formula may name
// ---------------------------------------------------------------------------------------------

export interface NameInfo {
  source: "signal" | "setting" | "constant";
  /** For a setting whose unit follows a choice, the dimension at the choice's saved value. */
  dimension: InferredDimension;
  /** Choice settings: the allowed strings. */
  options?: readonly string[];
  /** A numeric setting declared without a unit: it adapts like a literal, and we say where it did. */
  unitless?: boolean;
  /** A setting whose unit follows a choice setting (schema `unitBy`): its dimension for each option. */
  byChoice?: ChoiceDimensions;
}

/** What a setting with `unitBy` is under each option of the choice it follows. */
export interface ChoiceDimensions {
  setting: string;
  byOption: ReadonlyMap<string, { dimension: InferredDimension; unitless: boolean }>;
  /** The choice's saved value, when it is one of its options. */
  current: string | null;
}
export type FormulaScope = ReadonlyMap<string, NameInfo>;

/** mathjs' own constants that a formula may reasonably use. */
const CONSTANTS: Record<string, number> = { pi: Math.PI, e: Math.E };

export function signalDimension(name: SignalName): Dimension {
  return dimensionOfUnit(SIGNALS[name].unit) ?? DIMENSIONS.dimensionless;
}

export function settingDimension(s: Setting): InferredDimension {
  if (s.options && s.options.length > 0) return DIMENSIONS.text;
  if (typeof s.value === "string" && !s.formula) return DIMENSIONS.text;
  return dimensionOfUnit(s.unit ?? "") ?? "unknown";
}

function unitInfo(unit: string): { dimension: InferredDimension; unitless: boolean } {
  const dimension = dimensionOfUnit(unit) ?? "unknown";
  return { dimension, unitless: unit.trim() === "" && dimension !== "unknown" && dimension.kind === "quantity" };
}

/**
 * The dimensions of a setting with `unitBy`, or null when `unitBy` names no choice setting (the
 * setting-unit-by-invalid check reports that; the setting then keeps its own `unit`). Options the
 * `units` map leaves out fall back to the setting's `unit`; keys that are not options are ignored.
 */
function choiceDimensions(s: Setting, settings: Readonly<Record<string, Setting>>): ChoiceDimensions | null {
  if (!s.unitBy || s.options?.length) return null;
  const choice = settings[s.unitBy.setting];
  if (!choice?.options?.length) return null;
  const byOption = new Map<string, { dimension: InferredDimension; unitless: boolean }>();
  for (const option of choice.options) {
    byOption.set(option, unitInfo(Object.hasOwn(s.unitBy.units, option) ? s.unitBy.units[option] : (s.unit ?? "")));
  }
  const current = typeof choice.value === "string" && choice.options.includes(choice.value) ? choice.value : null;
  return { setting: s.unitBy.setting, byOption, current };
}

/**
 * Signals, then settings (a setting may not reuse a signal's name; a check reports that), then constants.
 * A setting with `unitBy` gets the dimension of the choice's saved value here; inside a `? :` branch
 * that settles the choice, the inference uses that option's dimension instead.
 */
export function formulaScope(settings: Readonly<Record<string, Setting>>): FormulaScope {
  const scope = new Map<string, NameInfo>();
  for (const name of Object.keys(CONSTANTS)) scope.set(name, { source: "constant", dimension: DIMENSIONS.dimensionless });
  for (const [name, s] of Object.entries(settings)) {
    const byChoice = choiceDimensions(s, settings);
    if (byChoice) {
      const at = byChoice.current === null ? null : byChoice.byOption.get(byChoice.current);
      const entry = at ?? { dimension: "unknown" as const, unitless: false };
      scope.set(name, { source: "setting", dimension: entry.dimension, options: s.options, unitless: entry.unitless, byChoice });
      continue;
    }
    const dimension = settingDimension(s);
    const unitless = (s.unit ?? "").trim() === "" && dimension !== "unknown" && dimension.kind === "quantity";
    scope.set(name, { source: "setting", dimension, options: s.options, unitless });
  }
  for (const name of Object.keys(SIGNALS) as SignalName[]) {
    scope.set(name, { source: "signal", dimension: signalDimension(name) });
  }
  return scope;
}

// ---------------------------------------------------------------------------------------------
// Dimension inference
// ---------------------------------------------------------------------------------------------

export type FormulaProblemKind =
  | "syntax"
  | "unknown-name"
  | "unknown-function"
  | "unsupported"
  | "unit-mismatch"
  | "unknown-option"
  /** Not an error: a unit-less setting met a dimensioned quantity, so units could not be checked there. */
  | "unitless-setting";

export interface FormulaProblem {
  kind: FormulaProblemKind;
  message: string;
  /** 0-based character index, when known (syntax errors). */
  position?: number;
  /** The unknown name, for unknown-name / unknown-function / unknown-option. */
  name?: string;
}

export interface FormulaAnalysis {
  ast: MathNode | null;
  symbols: string[];
  functions: string[];
  dimension: InferredDimension;
  problems: FormulaProblem[];
}

/** What the place a formula sits in expects it to produce. */
export type Expectation = Dimension | "any";

interface Inferred {
  dim: InferredDimension;
  /** Built from number literals (or unit-less settings) only, so it adapts to the dimension it meets. */
  free: boolean;
  /** The unit-less setting a free value came from, if any. */
  unitless?: string;
}
const UNKNOWN: Inferred = { dim: "unknown", free: false };

const COMPARISONS = new Set(["equal", "unequal", "smaller", "larger", "smallerEq", "largerEq"]);
const LOGICAL = new Set(["and", "or", "xor"]);
const RELATIONAL_FN: Record<string, string> = {
  equal: "==",
  unequal: "!=",
  smaller: "<",
  larger: ">",
  smallerEq: "<=",
  largerEq: ">=",
};

/** Units people may type after a number out of habit: we explain instead of saying "unknown name". */
const UNIT_HINTS = new Set([...Object.keys(UNIT_SYMBOLS), "psi", "kPa", "Pa", "lpm"]);

/** Choice setting → the options it can still have where the inference is (inside `? :` branches). */
type Narrowing = ReadonlyMap<string, ReadonlySet<string>>;

/** How a condition settles choices: the options left when it is true, and when it is false. */
interface ChoiceTest {
  whenTrue: Narrowing;
  whenFalse: Narrowing;
}

class Inference {
  readonly problems: FormulaProblem[] = [];
  /** Unit-less setting → the dimensions it was taken as, reported once per setting at the end. */
  private readonly adapted = new Map<string, Set<string>>();
  private narrowing: Narrowing = new Map();
  constructor(private readonly scope: FormulaScope) {}

  /** Options `setting` can have here: all of them, less those an enclosing branch ruled out. */
  private optionsHere(setting: string): readonly string[] {
    const all = this.scope.get(setting)?.options ?? [];
    const left = this.narrowing.get(setting);
    return left ? all.filter((o) => left.has(o)) : all;
  }

  /**
   * `choice == "option"` (either way round, in parentheses, under `not`) and `and`/`or` of such tests:
   * the options of each choice left on each side. Anything else settles nothing.
   */
  private choiceTest(node: MathNode): ChoiceTest | null {
    const v = view(node);
    if (v.type === "ParenthesisNode") return this.choiceTest(v.content);
    if (v.type !== "OperatorNode") return null;
    if (v.fn === "not") {
      const inner = this.choiceTest(v.args[0]);
      return inner && { whenTrue: inner.whenFalse, whenFalse: inner.whenTrue };
    }
    if (v.fn === "and" || v.fn === "or") {
      const [a, b] = v.args.map((arg) => this.choiceTest(arg));
      if (!a && !b) return null;
      // An operand that settles nothing constrains nothing: treat it as a test that leaves every option.
      const none: ChoiceTest = { whenTrue: new Map(), whenFalse: new Map() };
      const x = a ?? none;
      const y = b ?? none;
      // `x and y` holds when both hold and fails when either fails; `or` the other way round.
      return v.fn === "and"
        ? { whenTrue: meet(x.whenTrue, y.whenTrue), whenFalse: join(x.whenFalse, y.whenFalse) }
        : { whenTrue: join(x.whenTrue, y.whenTrue), whenFalse: meet(x.whenFalse, y.whenFalse) };
    }
    if ((v.fn !== "equal" && v.fn !== "unequal") || v.args.length !== 2) return null;
    const [x, y] = v.args.map(view);
    const pair =
      x.type === "SymbolNode" && y.type === "ConstantNode" && typeof y.value === "string"
        ? { setting: x.name, option: y.value }
        : y.type === "SymbolNode" && x.type === "ConstantNode" && typeof x.value === "string"
          ? { setting: y.name, option: x.value }
          : null;
    if (!pair || !this.scope.get(pair.setting)?.options?.length) return null;
    const here = this.optionsHere(pair.setting);
    const equal = new Map([[pair.setting, new Set(here.filter((o) => o === pair.option))]]);
    const different = new Map([[pair.setting, new Set(here.filter((o) => o !== pair.option))]]);
    return v.fn === "equal" ? { whenTrue: equal, whenFalse: different } : { whenTrue: different, whenFalse: equal };
  }

  /** Infer `node` with the choices narrowed further by `n`. */
  private under(n: Narrowing | undefined, node: MathNode): Inferred {
    if (!n || n.size === 0) return this.infer(node);
    const outer = this.narrowing;
    this.narrowing = meet(outer, n);
    try {
      return this.infer(node);
    } finally {
      this.narrowing = outer;
    }
  }

  /**
   * A setting whose unit follows a choice: the dimension its options still possible here agree on;
   * where they disagree, the one at the choice's saved value; unknown (unchecked) when even that is
   * ruled out, which only happens with three or more options of different units.
   */
  private choiceDependent(name: string, c: ChoiceDimensions): Inferred {
    const here = this.optionsHere(c.setting).filter((o) => c.byOption.has(o));
    const entries = here.map((o) => c.byOption.get(o)!);
    const agree =
      entries.length > 0 &&
      entries.every(
        (e) =>
          e.unitless === entries[0].unitless &&
          (e.dimension === "unknown" || entries[0].dimension === "unknown"
            ? e.dimension === entries[0].dimension
            : sameDimension(e.dimension, entries[0].dimension)),
      );
    const entry = agree ? entries[0] : c.current !== null && here.includes(c.current) ? c.byOption.get(c.current)! : null;
    if (!entry) return UNKNOWN;
    if (entry.unitless) return { dim: DIMENSIONS.dimensionless, free: true, unitless: name };
    return { dim: entry.dimension, free: false };
  }

  /** Note that a free value met `dim`; only interesting when it is a unit-less setting meeting a unit. */
  adapt(free: Inferred, dim: InferredDimension): void {
    if (!free.unitless || dim === "unknown" || dim.kind !== "quantity" || sameDimension(dim, DIMENSIONS.dimensionless)) return;
    const uses = this.adapted.get(free.unitless) ?? new Set<string>();
    uses.add(describeDimension(dim));
    this.adapted.set(free.unitless, uses);
  }

  /** Problems including one note per unit-less setting that stood in for a dimensioned quantity. */
  finish(): FormulaProblem[] {
    const notes: FormulaProblem[] = [...this.adapted].map(([name, uses]) => ({
      kind: "unitless-setting",
      name,
      message: `${name} has no unit but is used as ${[...uses].join(" and as ")}, so its units cannot be checked here; give it a unit (one setting per use if it serves several).`,
    }));
    return [...this.problems, ...notes];
  }

  private report(kind: FormulaProblemKind, message: string, name?: string): void {
    if (this.problems.some((p) => p.message === message)) return;
    this.problems.push(name === undefined ? { kind, message } : { kind, message, name });
  }

  infer(node: MathNode): Inferred {
    const v = view(node);
    switch (v.type) {
      case "ConstantNode":
        if (typeof v.value === "number") return { dim: DIMENSIONS.dimensionless, free: true };
        if (typeof v.value === "string") return { dim: DIMENSIONS.text, free: false };
        if (typeof v.value === "boolean") return { dim: DIMENSIONS.boolean, free: false };
        this.report("unsupported", `\`${node.toString()}\` is not a value a formula can use.`);
        return UNKNOWN;
      case "SymbolNode":
        return this.symbol(v.name);
      case "ParenthesisNode":
        return this.infer(v.content);
      case "OperatorNode":
        return this.operator(node, v.fn, v.args);
      case "FunctionNode":
        return this.call(node, v.fn, v.args);
      case "ConditionalNode":
        return this.conditional(node, v.condition, v.trueExpr, v.falseExpr);
      case "RelationalNode":
        return this.relational(v.conditionals, v.params);
      case "other":
        this.report("unsupported", unsupportedMessage(v.nodeType, node));
        return UNKNOWN;
    }
  }

  private symbol(name: string): Inferred {
    const info = this.scope.get(name);
    if (!info) {
      const hint = UNIT_HINTS.has(name)
        ? ` Formulas use plain numbers in canonical units, so leave the unit "${name}" out.`
        : "";
      this.report("unknown-name", `\`${name}\` is not a signal or a setting.${hint}`, name);
      return UNKNOWN;
    }
    if (info.byChoice) return this.choiceDependent(name, info.byChoice);
    if (info.unitless) return { dim: DIMENSIONS.dimensionless, free: true, unitless: name };
    return { dim: info.dimension, free: false };
  }

  private operator(node: MathNode, fn: string, argNodes: MathNode[]): Inferred {
    // The right operand of `and` only matters when the left holds (of `or`, when it does not), so a
    // choice test on the left settles the choice on the right, as a `? :` condition does.
    const left = (fn === "and" || fn === "or") && argNodes.length === 2 ? this.choiceTest(argNodes[0]) : null;
    const args = left
      ? [this.infer(argNodes[0]), this.under(fn === "and" ? left.whenTrue : left.whenFalse, argNodes[1])]
      : argNodes.map((a) => this.infer(a));
    const text = node.toString();
    if (COMPARISONS.has(fn)) {
      this.comparable(args[0], args[1], text, fn === "equal" || fn === "unequal");
      this.checkOption(argNodes[0], argNodes[1]);
      this.checkOption(argNodes[1], argNodes[0]);
      return { dim: DIMENSIONS.boolean, free: false };
    }
    if (LOGICAL.has(fn) || fn === "not") {
      args.forEach((a, i) => this.condition(a, argNodes[i], `\`${fn}\``));
      return { dim: DIMENSIONS.boolean, free: false };
    }
    switch (fn) {
      case "add":
      case "subtract":
      case "mod":
        return this.same(args[0], args[1], text, fn === "mod" ? "take the remainder of" : fn === "add" ? "add" : "subtract");
      case "unaryMinus":
      case "unaryPlus":
        return this.numeric(args[0], argNodes[0], "negate") ? args[0] : UNKNOWN;
      case "multiply":
      case "divide":
        return this.product(args, argNodes, fn === "multiply" ? 1 : -1);
      case "pow":
        return this.power(args[0], argNodes[0], args[1], argNodes[1]);
      default:
        this.report("unsupported", `The operator in \`${text}\` is not supported in sequence formulas.`);
        return UNKNOWN;
    }
  }

  /** True when `a` may take part in arithmetic; reports booleans and text. */
  private numeric(a: Inferred, node: MathNode, verb: string): boolean {
    if (a.dim === "unknown") return false;
    if (a.dim.kind === "quantity") return true;
    this.report("unit-mismatch", `Cannot ${verb} \`${node.toString()}\`: it is ${describeDimension(a.dim)}, not a number.`);
    return false;
  }

  private same(a: Inferred, b: Inferred, text: string, verb: string): Inferred {
    if (a.dim === "unknown" || b.dim === "unknown") return UNKNOWN;
    if (a.dim.kind !== "quantity" || b.dim.kind !== "quantity") {
      this.report("unit-mismatch", `\`${text}\` tries to ${verb} ${describeDimension(a.dim)} and ${describeDimension(b.dim)}.`);
      return UNKNOWN;
    }
    if (a.free) {
      this.adapt(a, b.dim);
      return b.free ? { ...b, unitless: b.unitless ?? a.unitless } : b;
    }
    if (b.free) {
      this.adapt(b, a.dim);
      return a;
    }
    if (!sameDimension(a.dim, b.dim)) {
      this.report(
        "unit-mismatch",
        `\`${text}\` tries to ${verb} ${describeDimension(a.dim)} and ${describeDimension(b.dim)}.`,
      );
      return UNKNOWN;
    }
    return a;
  }

  private comparable(a: Inferred, b: Inferred, text: string, equality: boolean): void {
    if (a.dim === "unknown" || b.dim === "unknown") return;
    if (a.dim.kind === "quantity" && b.dim.kind === "quantity") {
      if (a.free) this.adapt(a, b.dim);
      if (b.free) this.adapt(b, a.dim);
      if (a.free || b.free || sameDimension(a.dim, b.dim)) return;
    } else if (equality && a.dim.kind === b.dim.kind) {
      return;
    } else if (!equality && a.dim.kind === "text" && b.dim.kind === "text") {
      this.report("unit-mismatch", `\`${text}\` orders text choices; only == and != apply to them.`);
      return;
    }
    this.report("unit-mismatch", `\`${text}\` compares ${describeDimension(a.dim)} with ${describeDimension(b.dim)}.`);
  }

  /** `mode == "VCX"` where `mode` is a choice without that option can never hold. */
  private checkOption(maybeSymbol: MathNode, maybeLiteral: MathNode): void {
    const s = view(maybeSymbol);
    const l = view(maybeLiteral);
    if (s.type !== "SymbolNode" || l.type !== "ConstantNode" || typeof l.value !== "string") return;
    const options = this.scope.get(s.name)?.options;
    if (options && !options.includes(l.value)) {
      this.report(
        "unknown-option",
        `"${l.value}" is not one of the choices of ${s.name} (${options.map((o) => `"${o}"`).join(", ")}).`,
        l.value,
      );
    }
  }

  /** Operands of and/or/not and ternary conditions: conditions, or plain numbers (mathjs truthiness). */
  private condition(a: Inferred, node: MathNode, where: string): void {
    if (a.dim === "unknown" || a.dim.kind === "boolean") return;
    if (a.dim.kind === "quantity" && (a.free || sameDimension(a.dim, DIMENSIONS.dimensionless))) return;
    this.report(
      "unit-mismatch",
      `${where} needs a condition, but \`${node.toString()}\` is ${describeDimension(a.dim)}.`,
    );
  }

  private product(args: Inferred[], nodes: MathNode[], sign: 1 | -1): Inferred {
    const ok = args.map((a, i) => this.numeric(a, nodes[i], sign === 1 ? "multiply" : "divide"));
    if (!ok.every(Boolean)) return UNKNOWN;
    const [a, b] = args;
    if (a.dim === "unknown" || b.dim === "unknown" || a.dim.kind !== "quantity" || b.dim.kind !== "quantity") return UNKNOWN;
    const free = a.free && b.free;
    const dim = combine(a.dim as Dimension & { kind: "quantity" }, b.dim as Dimension & { kind: "quantity" }, sign);
    return free ? { dim, free, unitless: a.unitless ?? b.unitless } : { dim, free };
  }

  private power(base: Inferred, baseNode: MathNode, exp: Inferred, expNode: MathNode): Inferred {
    if (!this.numeric(base, baseNode, "raise") || !this.numeric(exp, expNode, "raise to")) return UNKNOWN;
    if (base.dim === "unknown" || base.dim.kind !== "quantity") return UNKNOWN;
    if (exp.dim !== "unknown" && exp.dim.kind === "quantity" && !exp.free && !sameDimension(exp.dim, DIMENSIONS.dimensionless)) {
      this.report("unit-mismatch", `The exponent \`${expNode.toString()}\` must be a plain number, not ${describeDimension(exp.dim)}.`);
      return UNKNOWN;
    }
    if (base.free || sameDimension(base.dim, DIMENSIONS.dimensionless)) return { dim: base.dim, free: base.free && exp.free };
    const power = literalNumber(expNode);
    if (power === null) {
      this.report(
        "unit-mismatch",
        `\`${baseNode.toString()}\` is ${describeDimension(base.dim)}, so it can only be raised to a fixed number.`,
      );
      return UNKNOWN;
    }
    return { dim: scale(base.dim as Dimension & { kind: "quantity" }, power), free: false };
  }

  private dimensionlessOnly(args: Inferred[], nodes: MathNode[], what: string): Inferred {
    for (const [i, a] of args.entries()) {
      if (a.dim === "unknown") return UNKNOWN;
      if (a.dim.kind !== "quantity" || (!a.free && !sameDimension(a.dim, DIMENSIONS.dimensionless))) {
        this.report("unit-mismatch", `${what} needs a plain number, but \`${nodes[i].toString()}\` is ${describeDimension(a.dim)}.`);
        return UNKNOWN;
      }
    }
    return { dim: DIMENSIONS.dimensionless, free: args.every((a) => a.free) };
  }

  private call(node: MathNode, fnNode: MathNode, argNodes: MathNode[]): Inferred {
    const fn = view(fnNode);
    const args = argNodes.map((a) => this.infer(a));
    if (fn.type !== "SymbolNode") {
      this.report("unsupported", `\`${node.toString()}\` calls something that is not a named function.`);
      return UNKNOWN;
    }
    const rule = FUNCTIONS[fn.name];
    if (!rule) {
      const asName = this.scope.get(fn.name);
      const why = asName ? ` ${fn.name} is a ${asName.source}, not a function; write * to multiply.` : "";
      this.report("unknown-function", `\`${fn.name}(…)\` is not a function sequence formulas can use.${why}`, fn.name);
      return UNKNOWN;
    }
    if (argNodes.length < rule.minArgs || argNodes.length > rule.maxArgs) {
      const count = rule.minArgs === rule.maxArgs ? `${rule.minArgs}` : `${rule.minArgs} to ${rule.maxArgs === Infinity ? "any number of" : rule.maxArgs}`;
      this.report("unsupported", `\`${fn.name}\` takes ${count} argument${rule.maxArgs === 1 ? "" : "s"}.`);
      return UNKNOWN;
    }
    return rule.infer(this, args, argNodes, fn.name);
  }

  private conditional(node: MathNode, c: MathNode, t: MathNode, f: MathNode): Inferred {
    this.condition(this.infer(c), c, "The `? :` test");
    const test = this.choiceTest(c);
    const a = this.under(test?.whenTrue, t);
    const b = this.under(test?.whenFalse, f);
    if (a.dim === "unknown" || b.dim === "unknown") return UNKNOWN;
    if (a.dim.kind === "quantity" && b.dim.kind === "quantity") return this.same(a, b, node.toString(), "choose between");
    if (a.dim.kind === b.dim.kind) return a;
    this.report(
      "unit-mismatch",
      `The two branches of \`${node.toString()}\` give ${describeDimension(a.dim)} and ${describeDimension(b.dim)}.`,
    );
    return UNKNOWN;
  }

  private relational(conditionals: string[], params: MathNode[]): Inferred {
    const args = params.map((p) => this.infer(p));
    conditionals.forEach((fn, i) => {
      const text = `${params[i].toString()} ${RELATIONAL_FN[fn] ?? fn} ${params[i + 1].toString()}`;
      this.comparable(args[i], args[i + 1], text, fn === "equal" || fn === "unequal");
    });
    return { dim: DIMENSIONS.boolean, free: false };
  }

  // Helpers the function table uses.
  sameAll(args: Inferred[], nodes: MathNode[], name: string): Inferred {
    let acc: Inferred = args[0];
    for (let i = 1; i < args.length; i++) acc = this.same(acc, args[i], `${name}(${nodes.map((n) => n.toString()).join(", ")})`, "mix");
    if (acc.dim !== "unknown" && acc.dim.kind !== "quantity") {
      this.report("unit-mismatch", `\`${name}\` needs numbers, not ${describeDimension(acc.dim)}.`);
      return UNKNOWN;
    }
    return acc;
  }
  dimensionless(args: Inferred[], nodes: MathNode[], name: string): Inferred {
    return this.dimensionlessOnly(args, nodes, `\`${name}\``);
  }
  root(args: Inferred[], nodes: MathNode[], power: number): Inferred {
    const [a] = args;
    if (!this.numeric(a, nodes[0], "take the root of")) return UNKNOWN;
    if (a.dim === "unknown" || a.dim.kind !== "quantity") return UNKNOWN;
    return { dim: scale(a.dim as Dimension & { kind: "quantity" }, power), free: a.free };
  }
  angleOrPlain(args: Inferred[], nodes: MathNode[], name: string): Inferred {
    const [a] = args;
    if (a.dim !== "unknown" && a.dim.kind === "quantity" && sameDimension(a.dim, DIMENSIONS.angle)) {
      return { dim: DIMENSIONS.dimensionless, free: false };
    }
    return this.dimensionlessOnly(args, nodes, `\`${name}\``);
  }
  powerCall(args: Inferred[], nodes: MathNode[]): Inferred {
    return this.power(args[0], nodes[0], args[1], nodes[1]);
  }
}

/** Both narrowings at once: per choice, the options both allow. */
function meet(a: Narrowing, b: Narrowing): Narrowing {
  const out = new Map(a);
  for (const [k, v] of b) {
    const prior = out.get(k);
    out.set(k, prior ? new Set([...v].filter((o) => prior.has(o))) : v);
  }
  return out;
}

/** Either narrowing: per choice narrowed on both sides, the options either allows; others are free. */
function join(a: Narrowing, b: Narrowing): Narrowing {
  const out = new Map<string, ReadonlySet<string>>();
  for (const [k, v] of a) {
    const other = b.get(k);
    if (other) out.set(k, new Set([...v, ...other]));
  }
  return out;
}

function unsupportedMessage(nodeType: string, node: MathNode): string {
  switch (nodeType) {
    case "AssignmentNode":
      return `\`${node.toString()}\` assigns a value; use == to compare.`;
    case "FunctionAssignmentNode":
      return "Formulas cannot define functions.";
    case "BlockNode":
      return "A formula is one expression; remove the ; or line break.";
    case "ArrayNode":
    case "IndexNode":
    case "AccessorNode":
    case "RangeNode":
      return `\`${node.toString()}\` uses lists or indexing, which sequence formulas do not support.`;
    case "ObjectNode":
      return "Formulas cannot build objects.";
    default:
      return `\`${node.toString()}\` is not supported in sequence formulas.`;
  }
}

interface FunctionRule {
  minArgs: number;
  maxArgs: number;
  infer: (ctx: Inference, args: Inferred[], nodes: MathNode[], name: string) => Inferred;
}

const sameRule = (min: number, max: number): FunctionRule => ({
  minArgs: min,
  maxArgs: max,
  infer: (ctx, args, nodes, name) => ctx.sameAll(args, nodes, name),
});
const plainRule = (min: number, max: number): FunctionRule => ({
  minArgs: min,
  maxArgs: max,
  infer: (ctx, args, nodes, name) => ctx.dimensionless(args, nodes, name),
});

/**
 * Functions we understand: the same list the engine's restricted instance allows (machines/formula.ts);
 * anything else is reported, since the engine would refuse it.
 */
const FUNCTIONS: Record<string, FunctionRule> = {
  min: sameRule(1, Infinity),
  max: sameRule(1, Infinity),
  abs: sameRule(1, 1),
  floor: sameRule(1, 1),
  ceil: sameRule(1, 1),
  round: {
    minArgs: 1,
    maxArgs: 2,
    infer: (ctx, args, nodes, name) => {
      if (args.length === 2) ctx.dimensionless([args[1]], [nodes[1]], name);
      return ctx.sameAll([args[0]], [nodes[0]], name);
    },
  },
  sign: {
    minArgs: 1,
    maxArgs: 1,
    infer: (ctx, args, nodes, name) => {
      const a = ctx.sameAll(args, nodes, name);
      return a.dim === "unknown" ? a : { dim: DIMENSIONS.dimensionless, free: a.free };
    },
  },
  sqrt: { minArgs: 1, maxArgs: 1, infer: (ctx, args, nodes) => ctx.root(args, nodes, 1 / 2) },
  pow: { minArgs: 2, maxArgs: 2, infer: (ctx, args, nodes) => ctx.powerCall(args, nodes) },
  exp: plainRule(1, 1),
  log: plainRule(1, 2),
  log10: plainRule(1, 1),
  sin: { minArgs: 1, maxArgs: 1, infer: (ctx, args, nodes, name) => ctx.angleOrPlain(args, nodes, name) },
  cos: { minArgs: 1, maxArgs: 1, infer: (ctx, args, nodes, name) => ctx.angleOrPlain(args, nodes, name) },
  tan: { minArgs: 1, maxArgs: 1, infer: (ctx, args, nodes, name) => ctx.angleOrPlain(args, nodes, name) },
};

/** Function names the analysis understands, for the inspector's "names you may use" list. */
export const KNOWN_FUNCTIONS: readonly string[] = Object.keys(FUNCTIONS);

function expectationProblem(result: Inferred, expect: Expectation, expr: string): FormulaProblem | null {
  if (expect === "any" || result.dim === "unknown") return null;
  const got = result.dim;
  if (expect.kind === "boolean") {
    if (got.kind === "boolean") return null;
    if (got.kind === "quantity" && (result.free || sameDimension(got, DIMENSIONS.dimensionless))) return null;
  } else if (expect.kind === "quantity" && got.kind === "quantity") {
    if (result.free || sameDimension(got, expect)) return null;
  } else if (expect.kind === got.kind) {
    return null;
  }
  return {
    kind: "unit-mismatch",
    message: `\`${expr}\` gives ${describeDimension(got)}, but ${describeDimension(expect)} is expected here.`,
  };
}

/**
 * Parse and check a formula against a scope. `expect` is what the place the formula sits in needs:
 * a condition for guards and monitors, a time for timers, the setting's own unit for derived settings.
 */
export function analyseFormula(expr: string, scope: FormulaScope, expect: Expectation = "any"): FormulaAnalysis {
  const parsed = parseFormula(expr);
  if (!parsed.ok) {
    const problem: FormulaProblem = { kind: "syntax", message: parsed.error.message };
    if (parsed.error.position !== null) problem.position = parsed.error.position;
    return { ast: null, symbols: [], functions: [], dimension: "unknown", problems: [problem] };
  }
  const inference = new Inference(scope);
  const result = inference.infer(parsed.ast);
  if (result.free && expect !== "any") inference.adapt(result, expect);
  const problems = inference.finish();
  const mismatch = expectationProblem(result, expect, expr);
  if (mismatch) problems.push(mismatch);
  const { symbols, functions } = formulaNames(parsed.ast);
  return { ast: parsed.ast, symbols, functions, dimension: result.dim, problems };
}

// ---------------------------------------------------------------------------------------------
// Value ranges: is a guard constant? what can a delay be?
// ---------------------------------------------------------------------------------------------

/**
 * A sound over-approximation of the values an expression can take (interval arithmetic). "always"
 * and "never" verdicts are therefore certain; anything the arithmetic cannot bound is "depends".
 */
export type RangeValue =
  | { kind: "number"; lo: number; hi: number }
  | { kind: "boolean"; canBeTrue: boolean; canBeFalse: boolean }
  | { kind: "text"; values: readonly string[] | null }
  | { kind: "unknown" };

export type RangeEnvironment = ReadonlyMap<string, RangeValue>;

const ANY_NUMBER: RangeValue = { kind: "number", lo: -Infinity, hi: Infinity };
const UNKNOWN_RANGE: RangeValue = { kind: "unknown" };
const point = (x: number): RangeValue => (Number.isNaN(x) ? UNKNOWN_RANGE : { kind: "number", lo: x, hi: x });
const interval = (lo: number, hi: number): RangeValue =>
  Number.isNaN(lo) || Number.isNaN(hi) ? ANY_NUMBER : { kind: "number", lo, hi };
const bool = (canBeTrue: boolean, canBeFalse: boolean): RangeValue => ({ kind: "boolean", canBeTrue, canBeFalse });

/** What a signal can read. Only the clocks are bounded: they restart at zero and only grow. */
export function signalRange(name: SignalName): RangeValue {
  return name === "tStep" || name === "tBreath" ? interval(0, Infinity) : ANY_NUMBER;
}

export type SettingsMode =
  /** Every value an operator may choose: [min, max]; a setting without bounds is a fixed parameter. */
  | "bounds"
  /** The values as saved. */
  | "defaults";

/**
 * The range of every signal and setting. Derived settings are bounded through their formulas;
 * a setting in a formula cycle is unknown (the cycle is reported by its own check).
 */
export function rangeEnvironment(
  settings: Readonly<Record<string, Setting>>,
  mode: SettingsMode,
  signals: Partial<Record<SignalName, RangeValue>> = {},
): RangeEnvironment {
  const env = new Map<string, RangeValue>();
  for (const name of Object.keys(CONSTANTS)) env.set(name, point(CONSTANTS[name]));
  const resolving = new Set<string>();
  const resolve = (name: string): RangeValue => {
    const known = env.get(name);
    if (known) return known;
    const s = settings[name];
    if (!s || resolving.has(name)) return UNKNOWN_RANGE;
    resolving.add(name);
    const value = settingRange(s, mode, (expr) => {
      const parsed = parseFormula(expr);
      return parsed.ok ? evaluateRangeAst(parsed.ast, lookup) : UNKNOWN_RANGE;
    });
    resolving.delete(name);
    env.set(name, value);
    return value;
  };
  const lookup: RangeEnvironment = {
    get: (name: string) => (name in SIGNALS ? (signals[name as SignalName] ?? signalRange(name as SignalName)) : resolve(name)),
  } as RangeEnvironment;
  for (const name of Object.keys(settings)) resolve(name);
  for (const name of Object.keys(SIGNALS) as SignalName[]) env.set(name, signals[name] ?? signalRange(name));
  return env;
}

function settingRange(s: Setting, mode: SettingsMode, evaluate: (expr: string) => RangeValue): RangeValue {
  if (s.formula) return evaluate(s.formula);
  if (s.options && s.options.length > 0) {
    if (mode === "bounds") return { kind: "text", values: s.options };
    return typeof s.value === "string" ? { kind: "text", values: [s.value] } : { kind: "text", values: s.options };
  }
  if (typeof s.value === "string") return { kind: "text", values: [s.value] };
  if (mode === "defaults" || (s.min === undefined && s.max === undefined)) {
    return typeof s.value === "number" ? point(s.value) : interval(s.min ?? -Infinity, s.max ?? Infinity);
  }
  return interval(s.min ?? -Infinity, s.max ?? Infinity);
}

/** mathjs compares numbers with a relative tolerance (config.relTol 1e-12, absTol 1e-15); we match it. */
function nearlyEqual(a: number, b: number): boolean {
  if (a === b) return true;
  if (!Number.isFinite(a) || !Number.isFinite(b)) return false;
  return Math.abs(a - b) <= Math.max(1e-12 * Math.max(Math.abs(a), Math.abs(b)), 1e-15);
}

function truthiness(v: RangeValue): RangeValue {
  if (v.kind === "boolean") return v;
  if (v.kind === "number") return bool(!(v.lo === 0 && v.hi === 0), v.lo <= 0 && v.hi >= 0);
  return bool(true, true);
}

function compare(fn: string, a: RangeValue, b: RangeValue): RangeValue {
  if (a.kind === "number" && b.kind === "number") {
    if (a.lo === a.hi && b.lo === b.hi) {
      const x = a.lo;
      const y = b.lo;
      const eq = nearlyEqual(x, y);
      const r: Record<string, boolean> = {
        equal: eq,
        unequal: !eq,
        smaller: x < y && !eq,
        larger: x > y && !eq,
        smallerEq: x < y || eq,
        largerEq: x > y || eq,
      };
      return bool(r[fn], !r[fn]);
    }
    switch (fn) {
      case "smaller":
        return bool(a.lo < b.hi, a.hi >= b.lo);
      case "smallerEq":
        return bool(a.lo <= b.hi, a.hi > b.lo);
      case "larger":
        return bool(a.hi > b.lo, a.lo <= b.hi);
      case "largerEq":
        return bool(a.hi >= b.lo, a.lo < b.hi);
      case "equal":
        return bool(a.lo <= b.hi && b.lo <= a.hi, true);
      case "unequal":
        return bool(true, a.lo <= b.hi && b.lo <= a.hi);
    }
  }
  if (a.kind === "text" && b.kind === "text" && (fn === "equal" || fn === "unequal")) {
    if (a.values === null || b.values === null) return bool(true, true);
    const overlap = a.values.some((x) => b.values!.includes(x));
    const single = a.values.length === 1 && b.values.length === 1 && a.values[0] === b.values[0];
    return fn === "equal" ? bool(overlap, !single) : bool(!single, overlap);
  }
  if (a.kind === "boolean" && b.kind === "boolean" && (fn === "equal" || fn === "unequal")) {
    const canEq = (a.canBeTrue && b.canBeTrue) || (a.canBeFalse && b.canBeFalse);
    const canNe = (a.canBeTrue && b.canBeFalse) || (a.canBeFalse && b.canBeTrue);
    return fn === "equal" ? bool(canEq, canNe) : bool(canNe, canEq);
  }
  return bool(true, true);
}

function productBounds(a: { lo: number; hi: number }, b: { lo: number; hi: number }): RangeValue {
  // 0 × ∞ is taken as 0: a factor pinned at zero keeps the product at zero.
  const mul = (x: number, y: number): number => (x === 0 || y === 0 ? 0 : x * y);
  const c = [mul(a.lo, b.lo), mul(a.lo, b.hi), mul(a.hi, b.lo), mul(a.hi, b.hi)];
  return interval(Math.min(...c), Math.max(...c));
}

function arithmetic(fn: string, a: RangeValue, b: RangeValue): RangeValue {
  if (a.kind !== "number" || b.kind !== "number") return UNKNOWN_RANGE;
  if (a.lo === a.hi && b.lo === b.hi) {
    const x = a.lo;
    const y = b.lo;
    const exact: Record<string, () => number> = {
      add: () => x + y,
      subtract: () => x - y,
      multiply: () => x * y,
      divide: () => x / y,
      mod: () => (y === 0 ? x : x - y * Math.floor(x / y)),
      pow: () => Math.pow(x, y),
    };
    return exact[fn] ? point(exact[fn]()) : UNKNOWN_RANGE;
  }
  switch (fn) {
    case "add":
      return interval(a.lo + b.lo, a.hi + b.hi);
    case "subtract":
      return interval(a.lo - b.hi, a.hi - b.lo);
    case "multiply":
      return productBounds(a, b);
    case "divide":
      if (b.lo <= 0 && b.hi >= 0) return ANY_NUMBER;
      return productBounds(a, { lo: 1 / b.hi, hi: 1 / b.lo });
    case "pow":
      // Monotone only for a non-negative base and a fixed non-negative exponent.
      if (b.lo === b.hi && b.lo >= 0 && a.lo >= 0) return interval(Math.pow(a.lo, b.lo), Math.pow(a.hi, b.lo));
      return UNKNOWN_RANGE;
    default:
      return UNKNOWN_RANGE;
  }
}

function monotone(f: (x: number) => number, a: RangeValue, domainLo = -Infinity): RangeValue {
  if (a.kind !== "number" || a.lo < domainLo) return UNKNOWN_RANGE;
  return interval(f(a.lo), f(a.hi));
}

function callRange(name: string, args: RangeValue[]): RangeValue {
  const nums = args.every((a) => a.kind === "number") ? (args as Array<RangeValue & { kind: "number" }>) : null;
  switch (name) {
    case "min":
      return nums && nums.length ? interval(Math.min(...nums.map((n) => n.lo)), Math.min(...nums.map((n) => n.hi))) : UNKNOWN_RANGE;
    case "max":
      return nums && nums.length ? interval(Math.max(...nums.map((n) => n.lo)), Math.max(...nums.map((n) => n.hi))) : UNKNOWN_RANGE;
    case "abs": {
      const [a] = args;
      if (a.kind !== "number") return UNKNOWN_RANGE;
      if (a.lo >= 0) return a;
      if (a.hi <= 0) return interval(-a.hi, -a.lo);
      return interval(0, Math.max(-a.lo, a.hi));
    }
    case "floor":
      return monotone(Math.floor, args[0]);
    case "ceil":
      return monotone(Math.ceil, args[0]);
    case "round":
      return args.length === 1 ? monotone(Math.round, args[0]) : UNKNOWN_RANGE;
    case "sqrt":
      // mathjs returns a complex number below zero, so only a non-negative range is bounded.
      return monotone(Math.sqrt, args[0], 0);
    case "exp":
      return monotone(Math.exp, args[0]);
    case "log10":
      return monotone(Math.log10, args[0], Number.MIN_VALUE);
    case "log":
      return args.length === 1 ? monotone(Math.log, args[0], Number.MIN_VALUE) : UNKNOWN_RANGE;
    case "sign":
      return monotone(Math.sign, args[0]);
    case "pow":
      return arithmetic("pow", args[0], args[1]);
    default:
      return UNKNOWN_RANGE;
  }
}

function unionRange(a: RangeValue, b: RangeValue): RangeValue {
  if (a.kind === "number" && b.kind === "number") return interval(Math.min(a.lo, b.lo), Math.max(a.hi, b.hi));
  if (a.kind === "boolean" && b.kind === "boolean") return bool(a.canBeTrue || b.canBeTrue, a.canBeFalse || b.canBeFalse);
  if (a.kind === "text" && b.kind === "text") {
    return { kind: "text", values: a.values && b.values ? [...new Set([...a.values, ...b.values])] : null };
  }
  return UNKNOWN_RANGE;
}

export function evaluateRangeAst(node: MathNode, env: RangeEnvironment): RangeValue {
  const v = view(node);
  const ev = (n: MathNode): RangeValue => evaluateRangeAst(n, env);
  switch (v.type) {
    case "ConstantNode":
      if (typeof v.value === "number") return point(v.value);
      if (typeof v.value === "boolean") return bool(v.value, !v.value);
      if (typeof v.value === "string") return { kind: "text", values: [v.value] };
      return UNKNOWN_RANGE;
    case "SymbolNode":
      return env.get(v.name) ?? UNKNOWN_RANGE;
    case "ParenthesisNode":
      return ev(v.content);
    case "OperatorNode": {
      const args = v.args.map(ev);
      if (COMPARISONS.has(v.fn)) return compare(v.fn, args[0], args[1]);
      if (v.fn === "not") {
        const a = truthiness(args[0]);
        return a.kind === "boolean" ? bool(a.canBeFalse, a.canBeTrue) : a;
      }
      if (LOGICAL.has(v.fn)) {
        const [a, b] = args.map(truthiness) as Array<RangeValue & { kind: "boolean" }>;
        if (v.fn === "and") return bool(a.canBeTrue && b.canBeTrue, a.canBeFalse || b.canBeFalse);
        if (v.fn === "or") return bool(a.canBeTrue || b.canBeTrue, a.canBeFalse && b.canBeFalse);
        return bool((a.canBeTrue && b.canBeFalse) || (a.canBeFalse && b.canBeTrue), (a.canBeTrue && b.canBeTrue) || (a.canBeFalse && b.canBeFalse));
      }
      if (v.fn === "unaryMinus") return args[0].kind === "number" ? interval(-args[0].hi, -args[0].lo) : UNKNOWN_RANGE;
      if (v.fn === "unaryPlus") return args[0];
      return arithmetic(v.fn, args[0], args[1]);
    }
    case "FunctionNode": {
      const fn = view(v.fn);
      return fn.type === "SymbolNode" ? callRange(fn.name, v.args.map(ev)) : UNKNOWN_RANGE;
    }
    case "ConditionalNode": {
      const c = truthiness(ev(v.condition));
      if (c.kind !== "boolean") return UNKNOWN_RANGE;
      if (c.canBeTrue && !c.canBeFalse) return ev(v.trueExpr);
      if (c.canBeFalse && !c.canBeTrue) return ev(v.falseExpr);
      return unionRange(ev(v.trueExpr), ev(v.falseExpr));
    }
    case "RelationalNode": {
      const vals = v.params.map(ev);
      let canBeTrue = true;
      let canBeFalse = false;
      v.conditionals.forEach((fn, i) => {
        const r = compare(fn, vals[i], vals[i + 1]);
        if (r.kind === "boolean") {
          canBeTrue = canBeTrue && r.canBeTrue;
          canBeFalse = canBeFalse || r.canBeFalse;
        }
      });
      return bool(canBeTrue, canBeFalse);
    }
    default:
      return UNKNOWN_RANGE;
  }
}

/** Range of a formula; unknown when it does not parse. */
export function evaluateRange(expr: string, env: RangeEnvironment): RangeValue {
  const parsed = parseFormula(expr);
  return parsed.ok ? evaluateRangeAst(parsed.ast, env) : UNKNOWN_RANGE;
}

export type GuardVerdict = "always" | "never" | "depends";

/**
 * Whether a condition is constant over the environment: "always" true, "never" true, or it "depends"
 * on live signals or on settings in a way interval bounds cannot settle.
 */
export function guardVerdict(expr: string, env: RangeEnvironment): GuardVerdict {
  const r = truthiness(evaluateRange(expr, env));
  if (r.kind !== "boolean") return "depends";
  if (r.canBeTrue && !r.canBeFalse) return "always";
  if (!r.canBeTrue) return "never";
  return "depends";
}
