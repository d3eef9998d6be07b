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

function toThunk(n: Anode, layout: SlotLayout, slots: Float64Array): Thunk | null {
  switch (n.type) {
    case "ConstantNode": {
      const v = n.value;
      const c = typeof v === "string" ? internString(v) : typeof v === "boolean" ? (v ? 1 : 0) : (v as number);
      return () => c;
    }
    case "SymbolNode": {
      const name = n.name as string;
      if (name in FORMULA_CONSTANTS) {
        const c = Number(FORMULA_CONSTANTS[name]);
        return () => c;
      }
      const i = layout.index.get(name);
      if (i === undefined) return null;
      return () => slots[i];
    }
    case "ParenthesisNode":
      return toThunk(n.content as Anode, layout, slots);
    case "ConditionalNode": {
      const c = toThunk(n.condition as Anode, layout, slots);
      const t = toThunk(n.trueExpr as Anode, layout, slots);
      const f = toThunk(n.falseExpr as Anode, layout, slots);
      if (!c || !t || !f) return null;
      return () => (c() !== 0 ? t() : f());
    }
    case "FunctionNode": {
      const name = (n.fn as unknown as Anode).name as string;
      const args = (n.args ?? []).map((a) => toThunk(a, layout, slots));
      if (args.some((a) => a === null)) return null;
      const as = args as Thunk[];
      if (name in UNARY_FN && as.length === 1) {
        const f = UNARY_FN[name];
        const a = as[0];
        return () => f(a());
      }
      if (name === "pow" && as.length === 2) {
        const [a, b] = as;
        return () => Math.pow(a(), b());
      }
      if ((name === "min" || name === "max") && as.length >= 1) {
        const pick = name === "min" ? Math.min : Math.max;
        if (as.length === 2) {
          const [a, b] = as;
          return () => pick(a(), b());
        }
        return () => {
          let r = as[0]();
          for (let k = 1; k < as.length; k++) r = pick(r, as[k]());
          return r;
        };
      }
      return null;
    }
    case "OperatorNode": {
      const args = (n.args ?? []).map((a) => toThunk(a, layout, slots));
      if (args.some((a) => a === null)) return null;
      const [a, b] = args as Thunk[];
      switch (n.fn as string) {
        case "add":
          return () => a() + b();
        case "subtract":
          return () => a() - b();
        case "multiply":
          return () => a() * b();
        case "divide":
          return () => a() / b();
        case "pow":
          return () => Math.pow(a(), b());
        case "mod":
          return () => mathjsMod(a(), b());
        case "unaryMinus":
          return () => -a();
        case "unaryPlus":
          return a;
        case "larger":
          return () => {
            const x = a(),
              y = b();
            return x > y && !nearlyEqual(x, y) ? 1 : 0;
          };
        case "smaller":
          return () => {
            const x = a(),
              y = b();
            return x < y && !nearlyEqual(x, y) ? 1 : 0;
          };
        case "largerEq":
          return () => {
            const x = a(),
              y = b();
            return x >= y || nearlyEqual(x, y) ? 1 : 0;
          };
        case "smallerEq":
          return () => {
            const x = a(),
              y = b();
            return x <= y || nearlyEqual(x, y) ? 1 : 0;
          };
        case "equal":
          return () => (nearlyEqual(a(), b()) ? 1 : 0);
        case "unequal":
          return () => (nearlyEqual(a(), b()) ? 0 : 1);
        case "and":
          return () => (a() !== 0 && b() !== 0 ? 1 : 0);
        case "or":
          return () => (a() !== 0 || b() !== 0 ? 1 : 0);
        case "xor":
          return () => ((a() !== 0) !== (b() !== 0) ? 1 : 0);
        case "not":
          return () => (a() === 0 ? 1 : 0);
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
      // Fallback (not reached by the whitelisted subset, kept for safety): mathjs on a scope built from slots.
      return () => {
        const scope: FormulaScope = {};
        for (const s of symbols) scope[s] = slotToValue(slots[layout.index.get(s) as number]);
        return valueToSlot(compiled.evaluate(scope));
      };
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
