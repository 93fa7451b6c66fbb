import { derivative, parse, type MathNode } from 'mathjs';

/** A model y = f(x, covariates; parameters), compiled once for fast repeated evaluation. */
export interface CompiledModel {
  expression: string;
  /** parameter names, in the order used by `p` arrays */
  parameters: string[];
  /** covariate names the expression uses, in the order of the `cov` arrays passed to it */
  covariates: string[];
  /** per parameter: whether its derivative column is analytic (else central differences) */
  analytic: boolean[];
  /** writes f at every point into out (length = x.length) */
  values(p: ArrayLike<number>, x: ArrayLike<number>, cov: ArrayLike<number>[], out: Float64Array): void;
  /** writes ∂f/∂p_j at every point into out, column-major (i + j·m, m = x.length) */
  gradient(p: ArrayLike<number>, x: ArrayLike<number>, cov: ArrayLike<number>[], out: Float64Array): void;
}

/** The compiled model, or why the expression cannot be used. */
export type CompileResult = { ok: true; model: CompiledModel } | { ok: false; reason: string };

const CONSTANTS: Record<string, string> = { pi: 'Math.PI', PI: 'Math.PI', e: 'Math.E', E: 'Math.E', tau: '(2*Math.PI)' };
const FUNCTIONS: Record<string, string> = {
  exp: 'Math.exp', log10: 'Math.log10', log2: 'Math.log2', sqrt: 'Math.sqrt', cbrt: 'Math.cbrt', sin: 'Math.sin',
  cos: 'Math.cos', tan: 'Math.tan', asin: 'Math.asin', acos: 'Math.acos', atan: 'Math.atan', atan2: 'Math.atan2',
  sinh: 'Math.sinh', cosh: 'Math.cosh', tanh: 'Math.tanh', abs: 'Math.abs', pow: 'Math.pow', sign: 'Math.sign',
  min: 'Math.min', max: 'Math.max', hypot: 'Math.hypot', expm1: 'Math.expm1', log1p: 'Math.log1p',
  square: '((v)=>v*v)', cube: '((v)=>v*v*v)', nthRoot: '((v,k)=>Math.pow(v,1/k))', sec: '((v)=>1/Math.cos(v))',
  csc: '((v)=>1/Math.sin(v))', cot: '((v)=>1/Math.tan(v))',
};
/** The same functions as values, for the closure evaluator used where `new Function` is not allowed. */
const FUNCTION_VALUES: Record<string, (...v: number[]) => number> = {
  exp: Math.exp, log10: Math.log10, log2: Math.log2, sqrt: Math.sqrt, cbrt: Math.cbrt, sin: Math.sin, cos: Math.cos,
  tan: Math.tan, asin: Math.asin, acos: Math.acos, atan: Math.atan, atan2: Math.atan2, sinh: Math.sinh, cosh: Math.cosh,
  tanh: Math.tanh, abs: Math.abs, pow: Math.pow, sign: Math.sign, min: Math.min, max: Math.max, hypot: Math.hypot,
  expm1: Math.expm1, log1p: Math.log1p, square: (v) => v * v, cube: (v) => v * v * v, nthRoot: (v, k) => Math.pow(v, 1 / k),
  sec: (v) => 1 / Math.cos(v), csc: (v) => 1 / Math.sin(v), cot: (v) => 1 / Math.tan(v),
  log: (v, b) => (b === undefined ? Math.log(v) : Math.log(v) / Math.log(b)),
};
const CONSTANT_VALUES: Record<string, number> = { pi: Math.PI, PI: Math.PI, e: Math.E, E: Math.E, tau: 2 * Math.PI };

type PointEvaluator = (p: ArrayLike<number>, x: ArrayLike<number>, cov: ArrayLike<number>[], i: number) => number;

/**
 * Closure tree for a node (slower than generated code, but needs no `new Function`, which some
 * runtimes forbid). The node has already passed {@link toJs}, so every symbol and function is known.
 */
function toClosure(node: MathNode, parameters: string[], covariates: string[]): PointEvaluator {
  const n = node as MathNode & { fn?: unknown; args?: MathNode[]; name?: string; value?: unknown; content?: MathNode };
  switch (node.type) {
    case 'ConstantNode': {
      const v = Number(n.value);
      return () => v;
    }
    case 'SymbolNode': {
      const name = n.name as string;
      if (name === 'x') return (_p, x, _c, i) => x[i];
      const c = covariates.indexOf(name);
      if (c >= 0) return (_p, _x, cov, i) => cov[c][i];
      const k = parameters.indexOf(name);
      if (k >= 0) return (p) => p[k];
      const v = CONSTANT_VALUES[name];
      return () => v;
    }
    case 'ParenthesisNode':
      return toClosure(n.content as MathNode, parameters, covariates);
    case 'OperatorNode': {
      const [f, g] = (n.args as MathNode[]).map((a) => toClosure(a, parameters, covariates));
      switch (n.fn as string) {
        case 'add': return (p, x, c, i) => f(p, x, c, i) + g(p, x, c, i);
        case 'subtract': return (p, x, c, i) => f(p, x, c, i) - g(p, x, c, i);
        case 'multiply': return (p, x, c, i) => f(p, x, c, i) * g(p, x, c, i);
        case 'divide': return (p, x, c, i) => f(p, x, c, i) / g(p, x, c, i);
        case 'pow': return (p, x, c, i) => Math.pow(f(p, x, c, i), g(p, x, c, i));
        case 'unaryMinus': return (p, x, c, i) => -f(p, x, c, i);
        default: return f;
      }
    }
    default: {
      const name = ((n.fn as { name?: string }).name ?? '') as string;
      const fn = FUNCTION_VALUES[name];
      const args = (n.args as MathNode[]).map((a) => toClosure(a, parameters, covariates));
      return (p, x, c, i) => fn(...args.map((a) => a(p, x, c, i)));
    }
  }
}

/** Whether this runtime allows generated code (edge runtimes and strict CSP pages do not). */
let generatedCodeAllowed: boolean | null = null;
function canGenerateCode(): boolean {
  if (generatedCodeAllowed === null) {
    try {
      generatedCodeAllowed = new Function('return 1')() === 1;
    } catch {
      generatedCodeAllowed = false;
    }
  }
  return generatedCodeAllowed;
}

const BINARY: Record<string, string> = { add: '+', subtract: '-', multiply: '*', divide: '/' };

/**
 * 1-based character position of the first whole-word occurrence of a symbol in an expression.
 * @param text - the expression
 * @param name - the symbol
 * @returns the position, or 0 when absent
 * @example symbolPosition('b1*x + offset', 'offset') // 8
 */
export function symbolPosition(text: string, name: string): number {
  const re = new RegExp(`(^|[^A-Za-z0-9_.])(${name.replace(/[$]/g, '\\$')})(?![A-Za-z0-9_])`);
  const m = re.exec(text);
  return m ? m.index + m[1].length + 1 : 0;
}

class ModelError extends Error {}

/**
 * a^b as JavaScript. A square is written as a product: Math.pow(a, 2) is a·a bit for bit (V8's
 * Math.pow is fdlibm's, whose e_pow.c returns x*x for y = 2 before anything else), and the product
 * costs a multiplication instead of a library call. Every other power stays Math.pow.
 */
function power(base: string, exponent: string): string {
  return exponent === '2' ? `(${base}*${base})` : `Math.pow(${base},${exponent})`;
}

/**
 * Emits JavaScript source for a mathjs node; symbols map through `sym`. With `bind`, every compound
 * subexpression is handed to it and replaced by what it returns (a variable: see {@link SharedCode}).
 */
function toJs(node: MathNode, sym: (name: string) => string, text: string, bind: (js: string) => string = (js) => js): string {
  const n = node as MathNode & { fn?: unknown; args?: MathNode[]; name?: string; value?: unknown; content?: MathNode; op?: string };
  switch (node.type) {
    case 'ConstantNode': {
      const v = Number(n.value);
      if (typeof n.value !== 'number' || !Number.isFinite(v)) throw new ModelError(`unsupported constant ${String(n.value)} in the model`);
      return v < 0 ? `(${String(v)})` : String(v);
    }
    case 'SymbolNode':
      return sym(n.name as string);
    case 'ParenthesisNode':
      return `(${toJs(n.content as MathNode, sym, text, bind)})`;
    case 'OperatorNode': {
      const fn = n.fn as string;
      const args = (n.args as MathNode[]).map((a) => toJs(a, sym, text, bind));
      if (fn === 'unaryMinus') return bind(`(-${args[0]})`);
      if (fn === 'unaryPlus') return bind(`(+${args[0]})`);
      if (fn === 'pow') return bind(power(args[0], args[1]));
      if (BINARY[fn] && args.length === 2) return bind(`(${args[0]}${BINARY[fn]}${args[1]})`);
      throw new ModelError(`operator "${n.op}" is not supported in a model expression`);
    }
    case 'FunctionNode': {
      const name = (n.fn as { name?: string }).name ?? '';
      const args = (n.args as MathNode[]).map((a) => toJs(a, sym, text, bind));
      if (name === 'log') return bind(args.length === 2 ? `(Math.log(${args[0]})/Math.log(${args[1]}))` : `Math.log(${args[0]})`);
      const js = FUNCTIONS[name];
      if (!js) throw new ModelError(`unknown function "${name}" at position ${symbolPosition(text, name)} of the model expression`);
      if (name === 'pow' && args.length === 2) return bind(power(args[0], args[1]));
      return bind(`${js}(${args.join(',')})`);
    }
    default:
      throw new ModelError(`a ${node.type.replace('Node', '').toLowerCase()} is not allowed in a model expression`);
  }
}

/**
 * Common subexpressions of generated code, each computed once: a subexpression that does not
 * involve the point (x[i], c…[i]) becomes a constant before the loop over points (`u…`), any other
 * one a constant inside it (`v…`), and a repeat of the same source reuses the first variable. The
 * values are those of the expression written out in full: the same operations on the same operands
 * (JavaScript evaluates every double operation exactly as written, with no reassociation or fused
 * operations), only not repeated.
 */
class SharedCode {
  readonly before: string[] = [];
  readonly inside: string[] = [];
  private readonly names = new Map<string, string>();

  readonly bind = (js: string): string => {
    let name = this.names.get(js);
    if (name === undefined) {
      const perPoint = /\[i\]|\bv\d+\b/.test(js);
      name = `${perPoint ? 'v' : 'u'}${this.names.size}`;
      (perPoint ? this.inside : this.before).push(`const ${name}=${js};`);
      this.names.set(js, name);
    }
    return name;
  };
}

/** Free symbols of a node (function names excluded), in order of first appearance. */
function freeSymbols(node: MathNode, out: string[] = []): string[] {
  const n = node as MathNode & { args?: MathNode[]; name?: string; content?: MathNode };
  if (node.type === 'SymbolNode') {
    if (!out.includes(n.name as string)) out.push(n.name as string);
  } else if (node.type === 'ParenthesisNode') {
    freeSymbols(n.content as MathNode, out);
  } else if (n.args) {
    for (const a of n.args) freeSymbols(a, out);
  }
  return out;
}

/**
 * Parses a model written as a mathjs expression in `x`, covariates and named parameters, derives
 * the analytic gradient with mathjs `derivative`, and compiles both to plain JavaScript functions
 * (one `new Function` per model) so that a fit evaluates them at native speed; where the runtime
 * forbids generated code (edge runtimes, strict CSP) it falls back to a closure tree.
 *
 * Policy: a syntax error, an unknown symbol (when `parameters` is given), an unsupported function
 * or operator gives `{ ok: false, reason }` naming the symbol and its 1-based character position.
 *
 * @param expression - e.g. `"b1*(1-exp(-b2*x))"` or `"Ts - (Ts - Tin)*exp(-UA/(rho*x*cp))"`
 * @param options.parameters - the parameter names; when absent every free symbol that is not x, a
 *   covariate or a constant (pi, e) is a parameter
 * @param options.covariates - names of per-point covariates available to the expression
 * @param options.generatedCode - false forces the closure evaluator (default: generated code where allowed)
 * @returns the compiled model or a reason
 * @example compileModel('a*exp(-k*x)').ok // true, parameters ['a', 'k']
 */
export function compileModel(expression: string, options: { parameters?: string[]; covariates?: string[]; generatedCode?: boolean } = {}): CompileResult {
  if (typeof expression !== 'string' || expression.trim() === '') return { ok: false, reason: 'the model expression is empty' };
  let root: MathNode;
  try {
    root = parse(expression);
  } catch (e) {
    return { ok: false, reason: `syntax error in the model expression: ${(e as Error).message}` };
  }
  const available = options.covariates ?? [];
  const symbols = freeSymbols(root);
  const covariates = symbols.filter((s) => available.includes(s) && s !== 'x');
  let parameters: string[];
  if (options.parameters) {
    parameters = options.parameters.slice();
    for (const s of symbols) {
      if (s === 'x' || covariates.includes(s) || parameters.includes(s) || s in CONSTANTS) continue;
      return { ok: false, reason: `unknown symbol "${s}" at position ${symbolPosition(expression, s)} of the model expression (not x, a covariate or a parameter with a start value)` };
    }
  } else {
    parameters = symbols.filter((s) => s !== 'x' && !covariates.includes(s) && !(s in CONSTANTS));
  }
  if (parameters.length === 0) return { ok: false, reason: 'the model expression has no parameters to fit' };
  const sym = (name: string): string => {
    if (name === 'x') return 'x[i]';
    const c = covariates.indexOf(name);
    if (c >= 0) return `c${c}[i]`;
    const k = parameters.indexOf(name);
    if (k >= 0) return `p${k}`;
    if (name in CONSTANTS) return CONSTANTS[name];
    throw new ModelError(`unknown symbol "${name}" at position ${symbolPosition(expression, name)} of the model expression`);
  };
  try {
    const head = parameters.map((_, k) => `const p${k}=p[${k}];`).join('') + covariates.map((_, c) => `const c${c}=cov[${c}];`).join('');
    toJs(root, sym, expression); // throws for what cannot be compiled
    const analytic: boolean[] = [];
    const derivatives: (MathNode | null)[] = [];
    parameters.forEach((name) => {
      let d: MathNode | null = null;
      try {
        d = derivative(root, name);
        toJs(d, sym, expression);
      } catch {
        d = null;
      }
      analytic.push(d !== null);
      derivatives.push(d);
    });
    let valuesFn: CompiledModel['values'];
    let analyticFn: CompiledModel['gradient'];
    if ((options.generatedCode ?? true) && canGenerateCode()) {
      // one loop over the points for the value and one for all analytic columns (which share most of
      // their subexpressions), each subexpression computed once
      const value = new SharedCode();
      const body = toJs(root, sym, expression, value.bind);
      valuesFn = new Function('p', 'x', 'cov', 'out', `${head}${value.before.join('')}const m=x.length;for(let i=0;i<m;i++){${value.inside.join('')}out[i]=${body};}`) as CompiledModel['values'];
      const gradient = new SharedCode();
      const columns = derivatives.map((d, k) => (d ? `out[i+${k}*m]=${toJs(d, sym, expression, gradient.bind)};` : ''));
      analyticFn = new Function('p', 'x', 'cov', 'out', `${head}${gradient.before.join('')}const m=x.length;for(let i=0;i<m;i++){${gradient.inside.join('')}${columns.join('')}}`) as CompiledModel['gradient'];
    } else {
      const value = toClosure(root, parameters, covariates);
      const partials = derivatives.map((d) => (d ? toClosure(d, parameters, covariates) : null));
      valuesFn = (p, x, cov, out) => {
        for (let i = 0; i < x.length; i++) out[i] = value(p, x, cov, i);
      };
      analyticFn = (p, x, cov, out) => {
        const m = x.length;
        partials.forEach((d, k) => {
          if (d) for (let i = 0; i < m; i++) out[i + k * m] = d(p, x, cov, i);
        });
      };
    }
    const allAnalytic = analytic.every(Boolean);
    const gradient: CompiledModel['gradient'] = (p, x, cov, out) => {
      analyticFn(p, x, cov, out);
      if (allAnalytic) return;
      numericColumns(valuesFn, analytic, p, x, cov, out);
    };
    return { ok: true, model: { expression, parameters, covariates, analytic, values: valuesFn, gradient } };
  } catch (e) {
    if (e instanceof ModelError) return { ok: false, reason: e.message };
    return { ok: false, reason: `the model expression cannot be compiled: ${(e as Error).message}` };
  }
}

/** Central differences for the columns without an analytic derivative; step ε^(1/3)·max(|p|, 1e-8). */
function numericColumns(values: CompiledModel['values'], analytic: boolean[], p: ArrayLike<number>, x: ArrayLike<number>, cov: ArrayLike<number>[], out: Float64Array): void {
  const m = x.length;
  const q = Float64Array.from(p);
  const fPlus = new Float64Array(m);
  const fMinus = new Float64Array(m);
  for (let k = 0; k < q.length; k++) {
    if (analytic[k]) continue;
    const h = 6.055454452393343e-6 * Math.max(Math.abs(q[k]), 1e-8); // ε^(1/3): balances truncation and rounding
    const up = q[k] + h;
    const down = q[k] - h;
    q[k] = up;
    values(q, x, cov, fPlus);
    q[k] = down;
    values(q, x, cov, fMinus);
    q[k] = p[k];
    const width = up - down; // the step as represented
    for (let i = 0; i < m; i++) out[i + k * m] = (fPlus[i] - fMinus[i]) / width;
  }
}
