/**
 * The formula language of sequences: a restricted mathjs instance.
 *
 * Users write guards, delays, commands and derived settings as mathjs expressions over settings and
 * signals (plain numbers in canonical units, or the string value of a choice setting). We parse each
 * formula once, check its node types and names, and compile it twice:
 * - `evaluate(scope)`: mathjs's own compiled evaluation on the restricted instance (the reference);
 * - `bind(slots)`: a closure tree over a Float64Array of slots, for the engine's scan loop, when the
 *   formula uses only arithmetic, comparisons, logic, conditionals and the whitelisted functions
 *   (the usual case). mathjs's evaluate costs ~1 µs per call through typed-function dispatch and scope
 *   wrapping; the closure costs nanoseconds, which keeps the controller far below the physics cost.
 *   Both paths agree (a property test checks it).
 *
 * Security: user formulas cannot reach `import`, `createUnit`, `evaluate`, `parse`, `compile`, `simplify`,
 * `derivative`, `resolve`, `parser`, `chain`, `help` or `reviver` (disabled as the mathjs security notes
 * recommend), cannot assign or define functions (those node types are rejected before compiling), and
 * every symbol must be a known setting, signal or constant.
 */
import { all, create, type MathNode } from "mathjs";

/** A formula error before any evaluation: syntax, forbidden construct, unknown name. */
export class FormulaError extends Error {
  constructor(
    message: string,
    readonly expr: string,
  ) {
    super(message);
    this.name = "FormulaError";
  }
}

const math = create(all);
// Keep our own references before the import below disables them for user scope.
const parseInternal = math.parse;

// mathjs compares strings with `==` by converting them to numbers ("Cannot convert "pressure" to a
// number"). Choice settings (e.g. trigger ∈ {pressure, flow}) need `trigger == "pressure"`, so the
// restricted instance gets string signatures merged into equal/unequal (typed-function merge).
math.import(
  {
    equal: math.typed("equal", { "string, string": (a: string, b: string) => a === b }),
    unequal: math.typed("unequal", { "string, string": (a: string, b: string) => a !== b }),
  },
  { override: false, silent: true },
);

function disabled(name: string) {
  return () => {
    throw new Error(`${name} is not available in sequence formulas`);
  };
}
const DISABLED_FUNCTIONS = [
  "import",
  "createUnit",
  "evaluate",
  "parse",
  "compile",
  "simplify",
  "simplifyConstant",
  "simplifyCore",
  "derivative",
  "resolve",
  "parser",
  "chain",
  "help",
  "reviver",
  "rationalize",
  "leafCount",
  "symbolicEqual",
] as const;
math.import(
  Object.fromEntries(DISABLED_FUNCTIONS.map((n) => [n, disabled(n)])),
  { override: true },
);

/** Functions a formula may call (all numeric, from mathjs). */
export const FORMULA_FUNCTIONS = [
  "abs",
  "min",
  "max",
  "sqrt",
  "exp",
  "log",
  "log10",
  "pow",
  "floor",
  "ceil",
  "round",
  "sign",
  "sin",
  "cos",
  "tan",
] as const;
const FUNCTION_SET = new Set<string>(FORMULA_FUNCTIONS);

/** Named constants a formula may use without declaring them. */
export const FORMULA_CONSTANTS: Record<string, number | boolean> = {
  pi: Math.PI,
  e: Math.E,
  true: true,
  false: false,
};

export type FormulaValue = number | string | boolean;
export type FormulaScope = Record<string, FormulaValue>;

/** Slot layout for bound formulas: name → index into a Float64Array; strings are interned to numbers. */
export interface SlotLayout {
  index: ReadonlyMap<string, number>;
}

export interface CompiledFormula {
  readonly expr: string;
  /** Settings and signals the formula reads (constants excluded), in order of first use. */
  readonly symbols: string[];
  /** String literals the formula compares with (for checking choice values). */
  readonly strings: string[];
  /** Whether `bind` produces a fast closure (true) or falls back to mathjs evaluation. */
  readonly fast: boolean;
  /** mathjs evaluation on the restricted instance with an explicit scope. Numbers, booleans or strings. */
  evaluate(scope: FormulaScope): FormulaValue;
  /** A function of the slot array: numbers (booleans as 1/0, strings as interned ids). */
  bind(layout: SlotLayout, slots: Float64Array): () => number;
  /**
   * Like `bind`, with the slots `fixed` says are constant (a run's settings) read once now and folded in:
   * `60 / RR + 5` becomes one number, `trigger == "pressure" ? a : b` one branch, a comparison of a signal
   * with such a constant one closure. Same results as `bind` (the same operations, evaluated once) while
   * those slots keep their values.
   */
  bindFolded(layout: SlotLayout, slots: Float64Array, fixed: (slot: number) => boolean): () => number;
}

// --- string interning: choice values become numbers in slot arrays ------------------------------------

const internTable = new Map<string, number>();
const internReverse: string[] = [];
/**
 * Number standing for a string inside slot arrays. Ids are large negative integers so that a string never
 * equals an ordinary setting value by accident (-1e9 - n).
 */
export function internString(s: string): number {
  let id = internTable.get(s);
  if (id === undefined) {
    id = -1e9 - internReverse.length;
    internTable.set(s, id);
    internReverse.push(s);
  }
  return id;
}
/** The string an interned id stands for, or undefined. */
export function internedString(id: number): string | undefined {
  const n = -1e9 - id;
  return Number.isInteger(n) && n >= 0 ? internReverse[n] : undefined;
}

// --- parsing and checks -----------------------------------------------------------------------------

const ALLOWED_OPERATORS = new Set([
  "add",
  "subtract",
  "multiply",
  "divide",
  "pow",
  "mod",
  "unaryMinus",
  "unaryPlus",
  "larger",
  "smaller",
  "largerEq",
  "smallerEq",
  "equal",
  "unequal",
  "and",
  "or",
  "not",
  "xor",
]);

interface Anode {
  type: string;
  fn?: string | { name: string };
  op?: string;
  args?: Anode[];
  name?: string;
  value?: unknown;
  content?: Anode;
  condition?: Anode;
  trueExpr?: Anode;
  falseExpr?: Anode;
  implicit?: boolean;
}

function describeNode(n: Anode): string {
  switch (n.type) {
    case "AssignmentNode":
      return "assignment (=) — use == to compare";
    case "FunctionAssignmentNode":
      return "function definition";
    case "AccessorNode":
    case "IndexNode":
      return "indexing ([...])";
    case "ArrayNode":
      return "arrays";
    case "ObjectNode":
      return "objects";
    case "BlockNode":
      return "several expressions (; or newline)";
    case "RangeNode":
      return "ranges (:)";
    case "RelationalNode":
      return "chained comparisons (a < b < c) — use `and`";
    default:
      return n.type;
  }
}

function check(n: Anode, expr: string, symbols: string[], strings: string[]): void {
  switch (n.type) {
    case "ConstantNode": {
      const v = n.value;
      if (typeof v === "string") {
        if (!strings.includes(v)) strings.push(v);
      } else if (typeof v !== "number" && typeof v !== "boolean") {
        throw new FormulaError(`unsupported constant in "${expr}"`, expr);
      }
      return;
    }
    case "SymbolNode": {
      const name = n.name as string;
      if (FUNCTION_SET.has(name)) throw new FormulaError(`"${name}" is a function: call it as ${name}(...)`, expr);
      if (!(name in FORMULA_CONSTANTS) && !symbols.includes(name)) symbols.push(name);
      return;
    }
    case "ParenthesisNode":
      check(n.content as Anode, expr, symbols, strings);
      return;
    case "OperatorNode": {
      const fn = n.fn as string;
      if (!ALLOWED_OPERATORS.has(fn)) throw new FormulaError(`operator "${n.op}" is not allowed in "${expr}"`, expr);
      if (n.implicit) {
        throw new FormulaError(
          `implicit multiplication in "${expr}" — write * between factors (units are not allowed; values are in canonical units)`,
          expr,
        );
      }
      for (const a of n.args ?? []) check(a, expr, symbols, strings);
      return;
    }
    case "ConditionalNode":
      check(n.condition as Anode, expr, symbols, strings);
      check(n.trueExpr as Anode, expr, symbols, strings);
      check(n.falseExpr as Anode, expr, symbols, strings);
      return;
    case "FunctionNode": {
      const fnNode = n.fn as unknown as Anode;
      const name = fnNode.type === "SymbolNode" ? (fnNode.name as string) : "";
      if (!FUNCTION_SET.has(name)) {
        throw new FormulaError(
          `function "${name || "?"}" is not allowed in "${expr}" (allowed: ${FORMULA_FUNCTIONS.join(", ")})`,
          expr,
        );
      }
      for (const a of n.args ?? []) check(a, expr, symbols, strings);
      return;
    }
    default:
      throw new FormulaError(`${describeNode(n)} is not allowed in "${expr}"`, expr);
  }
}

function parseChecked(expr: string): { node: MathNode; symbols: string[]; strings: string[] } {
  if (typeof expr !== "string" || expr.trim() === "") throw new FormulaError("formula is empty", String(expr));
  let node: MathNode;
  try {
    node = parseInternal(expr);
  } catch (e) {
    const msg = e instanceof Error ? e.message : String(e);
    throw new FormulaError(`syntax error in "${expr}": ${msg}`, expr);
  }
  const symbols: string[] = [];
  const strings: string[] = [];
  check(node as unknown as Anode, expr, symbols, strings);
  return { node, symbols, strings };
}

/** Names (settings or signals) a formula reads. Throws FormulaError on syntax errors. */
export function formulaSymbols(expr: string): string[] {
  return parseChecked(expr).symbols;
}

// --- the fast closure compiler ---------------------------------------------------------------------

type Thunk = () => number;

// mathjs compares numbers with a relative tolerance (config.relTol 1e-12, absTol 1e-15); mirror it so both
// evaluation paths agree on equality and strict inequalities.
const REL_TOL = 1e-12;
const ABS_TOL = 1e-15;
function nearlyEqual(a: number, b: number): boolean {
  if (a === b) return true;
  if (!Number.isFinite(a) || !Number.isFinite(b)) return false;
  const diff = Math.abs(a - b);
  return diff <= ABS_TOL || diff <= REL_TOL * Math.max(Math.abs(a), Math.abs(b));
}

// mathjs rounds halves away from zero, and floor/ceil snap to an integer within its tolerance.
const roundAway = (x: number) => (x < 0 ? -Math.round(-x) : Math.round(x));
const UNARY_FN: Record<string, (x: number) => number> = {
  abs: Math.abs,
  sqrt: Math.sqrt,
  exp: Math.exp,
  log: Math.log,
  log10: Math.log10,
  floor: (x) => (nearlyEqual(x, roundAway(x)) ? roundAway(x) : Math.floor(x)),
  ceil: (x) => (nearlyEqual(x, roundAway(x)) ? roundAway(x) : Math.ceil(x)),
  round: roundAway,
  sign: Math.sign,
  sin: Math.sin,
  cos: Math.cos,
  tan: Math.tan,
};

function mathjsMod(x: number, y: number): number {
  // mathjs mod: x - y * floor(x / y) with its tolerant floor, and mod(x, 0) = x.
  return y === 0 ? x : x - y * UNARY_FN.floor(x / y);
}

// Comparison operators by code, for the specialised closures below: one function, so V8 inlines it into
// each closure (a comparison passed in as a function value would be a call per evaluation).
const CMP_LARGER = 0;
const CMP_SMALLER = 1;
const CMP_LARGER_EQ = 2;
const CMP_SMALLER_EQ = 3;
const CMP_EQUAL = 4;
const CMP_UNEQUAL = 5;
const CMP_CODES: Record<string, number> = {
  larger: CMP_LARGER,
  smaller: CMP_SMALLER,
  largerEq: CMP_LARGER_EQ,
  smallerEq: CMP_SMALLER_EQ,
  equal: CMP_EQUAL,
  unequal: CMP_UNEQUAL,
};

function compare(op: number, x: number, y: number): number {
  switch (op) {
    case CMP_LARGER:
      return x > y && !nearlyEqual(x, y) ? 1 : 0;
    case CMP_SMALLER:
      return x < y && !nearlyEqual(x, y) ? 1 : 0;
    case CMP_LARGER_EQ:
      return x >= y || nearlyEqual(x, y) ? 1 : 0;
    case CMP_SMALLER_EQ:
      return x <= y || nearlyEqual(x, y) ? 1 : 0;
    case CMP_EQUAL:
      return nearlyEqual(x, y) ? 1 : 0;
    default:
      return nearlyEqual(x, y) ? 0 : 1;
  }
}

/**
 * What the closure compiler knows about a thunk it built: a constant (its value) or a plain slot read (its
 * index). A comparison of two such operands becomes one closure that reads the slot itself: comparisons
 * return small integers, so a guard such as `tStep >= 0.05 and paw <= K` runs without a double crossing a
 * call (V8 boxes every double returned by a closure it does not inline, and a closure tree's calls are not
 * inlined).
 */
interface Known {
  constants: Map<Thunk, number>;
  slotReads: Map<Thunk, number>;
  /** Thunks that are a conjunction (`and`) of comparisons between slots and constants: their terms. */
  conjunctions: Map<Thunk, CompareTerm[]>;
}

/** One comparison of a conjunction: each side a slot (index ≥ 0) or a constant (index −1 and its value). */
interface CompareTerm {
  op: number;
  slotA: number;
  constA: number;
  slotB: number;
  constB: number;
}

function constantThunk(c: number, known: Known): Thunk {
  const t = () => c;
  known.constants.set(t, c);
  return t;
}

function specialisedCompare(op: number, a: Thunk, b: Thunk, slots: Float64Array, known: Known): Thunk | null {
  const ca = known.constants.get(a);
  const cb = known.constants.get(b);
  const sa = known.slotReads.get(a);
  const sb = known.slotReads.get(b);
  let t: Thunk;
  if (sa !== undefined && cb !== undefined) t = () => compare(op, slots[sa], cb);
  else if (ca !== undefined && sb !== undefined) t = () => compare(op, ca, slots[sb]);
  else if (sa !== undefined && sb !== undefined) t = () => compare(op, slots[sa], slots[sb]);
  else return null;
  known.conjunctions.set(t, [{ op, slotA: sa ?? -1, constA: ca ?? 0, slotB: sb ?? -1, constB: cb ?? 0 }]);
  return t;
}

/**
 * `a and b` where both sides are comparisons (or conjunctions of them) between slots and constants: one
 * closure that runs the terms in order and stops at the first false one, as nested `and`s would (their
 * value is 1 exactly when every term is), instead of a call per node.
 */
function conjunction(terms: CompareTerm[], slots: Float64Array, known: Known): Thunk {
  const m = terms.length;
  const ops = Int32Array.from(terms, (x) => x.op);
  const slotA = Int32Array.from(terms, (x) => x.slotA);
  const constA = Float64Array.from(terms, (x) => x.constA);
  const slotB = Int32Array.from(terms, (x) => x.slotB);
  const constB = Float64Array.from(terms, (x) => x.constB);
  const t = () => {
    for (let j = 0; j < m; j++) {
      const ia = slotA[j];
      const ib = slotB[j];
      if (compare(ops[j], ia >= 0 ? slots[ia] : constA[j], ib >= 0 ? slots[ib] : constB[j]) === 0) return 0;
    }
    return 1;
  };
  known.conjunctions.set(t, terms);
  return t;
}

/**
 * Closure tree of a checked formula over the slots. With `fixed`, slots it names are read now and treated
 * as constants, and every operation whose operands are all constant is evaluated once, here, by the same
 * closure the tree would run (so the folded value is bit for bit what evaluation would give).
 */
function toThunk(n: Anode, layout: SlotLayout, slots: Float64Array, fixed?: (slot: number) => boolean, known?: Known): Thunk | null {
  const k: Known = known ?? { constants: new Map(), slotReads: new Map(), conjunctions: new Map() };
  const fold = (t: Thunk, args: Thunk[]): Thunk => {
    if (fixed && args.every((a) => k.constants.has(a))) return constantThunk(t(), k);
    return t;
  };
  switch (n.type) {
    case "ConstantNode": {
      const v = n.value;
      const c = typeof v === "string" ? internString(v) : typeof v === "boolean" ? (v ? 1 : 0) : (v as number);
      return constantThunk(c, k);
    }
    case "SymbolNode": {
      const name = n.name as string;
      if (name in FORMULA_CONSTANTS) {
        const c = Number(FORMULA_CONSTANTS[name]);
        return constantThunk(c, k);
      }
      const i = layout.index.get(name);
      if (i === undefined) return null;
      if (fixed && fixed(i)) return constantThunk(slots[i], k);
      const t = () => slots[i];
      k.slotReads.set(t, i);
      return t;
    }
    case "ParenthesisNode":
      return toThunk(n.content as Anode, layout, slots, fixed, k);
    case "ConditionalNode": {
      const c = toThunk(n.condition as Anode, layout, slots, fixed, k);
      const t = toThunk(n.trueExpr as Anode, layout, slots, fixed, k);
      const f = toThunk(n.falseExpr as Anode, layout, slots, fixed, k);
      if (!c || !t || !f) return null;
      // A constant condition picks its branch once (evaluation takes only that branch too).
      const cc = fixed ? k.constants.get(c) : undefined;
      if (cc !== undefined) return cc !== 0 ? t : f;
      return () => (c() !== 0 ? t() : f());
    }
    case "FunctionNode": {
      const name = (n.fn as unknown as Anode).name as string;
      const args = (n.args ?? []).map((a) => toThunk(a, layout, slots, fixed, k));
      if (args.some((a) => a === null)) return null;
      const as = args as Thunk[];
      if (name in UNARY_FN && as.length === 1) {
        const f = UNARY_FN[name];
        const a = as[0];
        return fold(() => f(a()), as);
      }
      if (name === "pow" && as.length === 2) {
        const [a, b] = as;
        return fold(() => Math.pow(a(), b()), as);
      }
      if ((name === "min" || name === "max") && as.length >= 1) {
        const pick = name === "min" ? Math.min : Math.max;
        if (as.length === 2) {
          const [a, b] = as;
          return fold(() => pick(a(), b()), as);
        }
        return fold(() => {
          let r = as[0]();
          for (let j = 1; j < as.length; j++) r = pick(r, as[j]());
          return r;
        }, as);
      }
      return null;
    }
    case "OperatorNode": {
      const args = (n.args ?? []).map((a) => toThunk(a, layout, slots, fixed, k));
      if (args.some((a) => a === null)) return null;
      const as = args as Thunk[];
      const [a, b] = as;
      const fn = n.fn as string;
      const cmp = CMP_CODES[fn];
      if (cmp !== undefined) {
        const generic = () => compare(cmp, a(), b());
        if (fixed && k.constants.has(a) && k.constants.has(b)) return fold(generic, as);
        return specialisedCompare(cmp, a, b, slots, k) ?? generic;
      }
      switch (fn) {
        case "add":
          return fold(() => a() + b(), as);
        case "subtract":
          return fold(() => a() - b(), as);
        case "multiply":
          return fold(() => a() * b(), as);
        case "divide":
          return fold(() => a() / b(), as);
        case "pow":
          return fold(() => Math.pow(a(), b()), as);
        case "mod":
          return fold(() => mathjsMod(a(), b()), as);
        case "unaryMinus":
          return fold(() => -a(), as);
        case "unaryPlus":
          return a;
        case "and": {
          const ta = k.conjunctions.get(a);
          const tb = k.conjunctions.get(b);
          if (ta && tb) return conjunction([...ta, ...tb], slots, k);
          return fold(() => (a() !== 0 && b() !== 0 ? 1 : 0), as);
        }
        case "or":
          return fold(() => (a() !== 0 || b() !== 0 ? 1 : 0), as);
        case "xor":
          return fold(() => ((a() !== 0) !== (b() !== 0) ? 1 : 0), as);
        case "not":
          return fold(() => (a() === 0 ? 1 : 0), as);
        default:
          return null;
      }
    }
    default:
      return null;
  }
}

function valueToSlot(v: unknown): number {
  if (typeof v === "number") return v;
  if (typeof v === "boolean") return v ? 1 : 0;
  if (typeof v === "string") return internString(v);
  throw new Error(`formula produced ${typeof v}, expected a number`);
}

function slotToValue(x: number): FormulaValue {
  return internedString(x) ?? x;
}

const cache = new Map<string, CompiledFormula>();

/**
 * Parse, check and compile a formula once. Throws FormulaError naming the problem (syntax, a forbidden
 * construct). Unknown names are the caller's check (it knows the settings): see `symbols`.
 */
export function compileFormula(expr: string): CompiledFormula {
  const hit = cache.get(expr);
  if (hit) return hit;
  const { node, symbols, strings } = parseChecked(expr);
  const code = node.compile();
  // Fallback of bind (not reached by the whitelisted subset, kept for safety): mathjs on a scope built from slots.
  const fallback = (layout: SlotLayout, slots: Float64Array) => () => {
    const scope: FormulaScope = {};
    for (const s of symbols) scope[s] = slotToValue(slots[layout.index.get(s) as number]);
    return valueToSlot(compiled.evaluate(scope));
  };
  const probe = toThunk(node as unknown as Anode, { index: new Map(symbols.map((s, i) => [s, i])) }, new Float64Array(symbols.length));
  const compiled: CompiledFormula = {
    expr,
    symbols,
    strings,
    fast: probe !== null,
    evaluate(scope: FormulaScope): FormulaValue {
      for (const s of symbols) {
        if (!(s in scope)) throw new FormulaError(`"${s}" has no value in "${expr}"`, expr);
      }
      let r: unknown;
      try {
        r = code.evaluate({ ...scope });
      } catch (e) {
        throw new FormulaError(`cannot evaluate "${expr}": ${e instanceof Error ? e.message : String(e)}`, expr);
      }
      if (typeof r === "number" || typeof r === "boolean" || typeof r === "string") return r;
      throw new FormulaError(`"${expr}" does not give a number`, expr);
    },
    bind(layout: SlotLayout, slots: Float64Array): () => number {
      for (const s of symbols) {
        if (!layout.index.has(s)) throw new FormulaError(`unknown name "${s}" in "${expr}"`, expr);
      }
      const t = toThunk(node as unknown as Anode, layout, slots);
      if (t) return t;
      return fallback(layout, slots);
    },
    bindFolded(layout: SlotLayout, slots: Float64Array, fixed: (slot: number) => boolean): () => number {
      for (const s of symbols) {
        if (!layout.index.has(s)) throw new FormulaError(`unknown name "${s}" in "${expr}"`, expr);
      }
      const t = toThunk(node as unknown as Anode, layout, slots, fixed);
      if (t) return t;
      return fallback(layout, slots);
    },
  };
  cache.set(expr, compiled);
  return compiled;
}

/** Evaluate a formula as a number (booleans as 1/0). Throws FormulaError when the result is not numeric. */
export function evaluateNumber(expr: string, scope: FormulaScope): number {
  const v = compileFormula(expr).evaluate(scope);
  if (typeof v === "string") throw new FormulaError(`"${expr}" gives text ("${v}"), expected a number`, expr);
  return typeof v === "boolean" ? (v ? 1 : 0) : v;
}

/** The restricted instance, for tests and for the units module's sibling checks. Do not expose to users. */
export const restrictedMath = math;
