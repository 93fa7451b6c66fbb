import { parse, type MathNode } from 'mathjs';
import { LruCache, MODEL_CACHE_CAPACITY } from './lru-cache';
import { ddAddTo, ddDivTo, ddExpTo, ddLogTo, ddMulTo, ddPowIntTo, ddPowTo, ddSqrtTo } from './double-double';

/*
 * Residuals y − f(x; p) evaluated in double-double arithmetic (about 32 digits) for the final
 * statistics of a fit. A fit in double precision finds p well, but when the residuals are tiny
 * compared with y (data generated from the model, as in NIST's Lanczos1, residuals 1e-13·y) the
 * double evaluation of f loses most digits of y − f, and RSS and standard errors with them.
 * Supported exactly: + − × ÷, integer powers, exp, log, sqrt, pi, e; any other function is
 * evaluated in double precision on the rounded argument (so the result is never worse than double).
 */


const DOUBLE_FUNCTIONS: Record<string, (...v: number[]) => number> = {
  sin: Math.sin, cos: Math.cos, tan: Math.tan, asin: Math.asin, acos: Math.acos, atan: Math.atan, atan2: Math.atan2,
  sinh: Math.sinh, cosh: Math.cosh, tanh: Math.tanh, abs: Math.abs, sign: Math.sign, min: Math.min, max: Math.max,
  log10: Math.log10, log2: Math.log2, cbrt: Math.cbrt, hypot: Math.hypot, expm1: Math.expm1, log1p: Math.log1p,
};

/*
 * The expression is compiled once into a tape: every node gets a register (a hi, lo pair in one
 * Float64Array), parameters and constants are loaded once per call, and each point runs the
 * point-dependent instructions in order through the allocation-free kernels of double-double.ts.
 * The arithmetic is exactly that of a node-by-node evaluation (same operations, same order).
 */
const enum Op { X, Cov, Add, Sub, Mul, Div, Pow, Neg, Exp, Log, Sqrt, Square, Cube, LogBase, Double }

/** A compiled expression: instructions as (op, destination, a, b) quadruples, a, b register or index. */
interface Tape {
  code: Int32Array;
  registers: number;
  /** registers loaded with parameter k: [register, k] pairs */
  params: number[];
  /** registers holding constants: [register, hi, lo] triples */
  constants: number[];
  /** functions evaluated in double precision, with the registers of their arguments */
  doubles: { fn: (...v: number[]) => number; args: number[] }[];
  /** register of the result */
  result: number;
  /** the registers, hi at 2r and lo at 2r + 1 (kept with the tape: a fresh typed array per call costs more than a small fit) */
  r: Float64Array;
}

function compileTape(root: MathNode, parameters: string[], covariates: string[]): Tape {
  const code: number[] = [];
  const params: number[] = [];
  const constants: number[] = [];
  const doubles: Tape['doubles'] = [];
  const leaves = new Map<string, number>();
  let registers = 0;
  const emit = (op: Op, a = 0, b = 0): number => {
    const d = registers++;
    code.push(op, d, a, b);
    return d;
  };
  const leaf = (key: string, make: (r: number) => void): number => {
    let r = leaves.get(key);
    if (r === undefined) {
      r = registers++;
      make(r);
      leaves.set(key, r);
    }
    return r;
  };
  const constant = (hi: number, lo: number): number => leaf(`c${Object.is(hi, -0) ? '-0' : hi},${lo}`, (r) => constants.push(r, hi, lo));
  const visit = (node: MathNode): number => {
    const n = node as MathNode & { fn?: unknown; args?: MathNode[]; name?: string; value?: unknown; content?: MathNode };
    switch (node.type) {
      case 'ConstantNode':
        return constant(Number(n.value), 0);
      case 'SymbolNode': {
        const name = n.name as string;
        if (name === 'x') return leaf('x', (r) => code.push(Op.X, r, 0, 0));
        const c = covariates.indexOf(name);
        if (c >= 0) return leaf(`v${c}`, (r) => code.push(Op.Cov, r, c, 0));
        const k = parameters.indexOf(name);
        if (k >= 0) return leaf(`p${k}`, (r) => params.push(r, k));
        if (name === 'pi' || name === 'PI') return constant(Math.PI, 1.2246467991473532e-16);
        if (name === 'e' || name === 'E') return constant(Math.E, 1.4456468917292502e-16);
        if (name === 'tau') return constant(2 * Math.PI, 2.4492935982947064e-16);
        throw new Error(`unknown symbol ${name}`);
      }
      case 'ParenthesisNode':
        return visit(n.content as MathNode);
      case 'OperatorNode': {
        const [f, g] = (n.args as MathNode[]).map(visit);
        switch (n.fn as string) {
          case 'add': return emit(Op.Add, f, g);
          case 'subtract': return emit(Op.Sub, f, g);
          case 'multiply': return emit(Op.Mul, f, g);
          case 'divide': return emit(Op.Div, f, g);
          case 'pow': return emit(Op.Pow, f, g);
          case 'unaryMinus': return emit(Op.Neg, f);
          case 'unaryPlus': return f;
          default: throw new Error(`operator ${String(n.fn)}`);
        }
      }
      case 'FunctionNode': {
        const name = (n.fn as { name?: string }).name ?? '';
        const args = (n.args as MathNode[]).map(visit);
        const [f, g] = args;
        if (name === 'exp') return emit(Op.Exp, f);
        if (name === 'log' && args.length === 1) return emit(Op.Log, f);
        if (name === 'sqrt') return emit(Op.Sqrt, f);
        if (name === 'pow') return emit(Op.Pow, f, g);
        if (name === 'square') return emit(Op.Square, f);
        if (name === 'cube') return emit(Op.Cube, f);
        if (name === 'log') return emit(Op.LogBase, f, g);
        const fn = DOUBLE_FUNCTIONS[name];
        if (!fn) throw new Error(`function ${name}`);
        doubles.push({ fn, args });
        return emit(Op.Double, doubles.length - 1);
      }
      default:
        throw new Error(`node ${node.type}`);
    }
  };
  const result = visit(root);
  return { code: Int32Array.from(code), registers, params, constants, doubles, result, r: new Float64Array(2 * registers) };
}

/** Runs the point-dependent instructions of a tape for point i (registers already hold parameters and constants). */
function runTape(tape: Tape, r: Float64Array, xi: number, cov: ArrayLike<number>[], i: number): void {
  const code = tape.code;
  for (let q = 0; q < code.length; q += 4) {
    const d = 2 * code[q + 1];
    const a = 2 * code[q + 2];
    const b = 2 * code[q + 3];
    switch (code[q] as Op) {
      case Op.X: r[d] = xi; r[d + 1] = 0; break;
      case Op.Cov: r[d] = cov[code[q + 2]][i]; r[d + 1] = 0; break;
      case Op.Add: ddAddTo(r[a], r[a + 1], r[b], r[b + 1], r, d); break;
      case Op.Sub: ddAddTo(r[a], r[a + 1], -r[b], -r[b + 1], r, d); break;
      case Op.Mul: ddMulTo(r[a], r[a + 1], r[b], r[b + 1], r, d); break;
      case Op.Div: ddDivTo(r[a], r[a + 1], r[b], r[b + 1], r, d); break;
      case Op.Pow: ddPowTo(r[a], r[a + 1], r[b], r[b + 1], r, d); break;
      case Op.Neg: r[d] = -r[a]; r[d + 1] = -r[a + 1]; break;
      case Op.Exp: ddExpTo(r[a], r[a + 1], r, d); break;
      case Op.Log: ddLogTo(r[a], r[a + 1], r, d); break;
      case Op.Sqrt: ddSqrtTo(r[a], r[a + 1], r, d); break;
      case Op.Square: ddPowIntTo(r[a], r[a + 1], 2, r, d); break;
      case Op.Cube: ddPowIntTo(r[a], r[a + 1], 3, r, d); break;
      case Op.LogBase: r[d] = Math.log(r[a]) / Math.log(r[b]); r[d + 1] = 0; break;
      case Op.Double: {
        const { fn, args } = tape.doubles[code[q + 2]];
        const u = 2 * args[0];
        if (args.length === 1) r[d] = fn(r[u] + r[u + 1]);
        else if (args.length === 2) r[d] = fn(r[u] + r[u + 1], r[2 * args[1]] + r[2 * args[1] + 1]);
        else r[d] = fn(...args.map((k) => r[2 * k] + r[2 * k + 1]));
        r[d + 1] = 0;
        break;
      }
    }
  }
}

const cache = new LruCache<Tape | null>(MODEL_CACHE_CAPACITY);
const RESIDUAL = new Float64Array(2);

/**
 * Writes yᵢ − f(xᵢ; p) into `out`, evaluated in double-double and rounded once.
 * @param expression - the model expression (already validated by compileModel)
 * @param parameters - parameter names in p order
 * @param covariates - covariate names in cov order
 * @returns false when the expression cannot be evaluated this way (the caller keeps double residuals)
 * @example extendedResiduals('b1*exp(-b2*x)', ['b1','b2'], [], p, x, [], y, out)
 */
export function extendedResiduals(expression: string, parameters: string[], covariates: string[], p: ArrayLike<number>, x: ArrayLike<number>, cov: ArrayLike<number>[], y: ArrayLike<number>, out: Float64Array): boolean {
  const key = `${expression}\u0000${parameters.join(',')}\u0000${covariates.join(',')}`;
  const tape = cache.get(key, () => {
    try {
      return compileTape(parse(expression), parameters, covariates);
    } catch {
      return null;
    }
  });
  if (!tape) return false;
  const r = tape.r;
  for (let q = 0; q < tape.params.length; q += 2) r[2 * tape.params[q]] = p[tape.params[q + 1]];
  for (let q = 0; q < tape.constants.length; q += 3) {
    r[2 * tape.constants[q]] = tape.constants[q + 1];
    r[2 * tape.constants[q] + 1] = tape.constants[q + 2];
  }
  const f = 2 * tape.result;
  const e = RESIDUAL;
  for (let i = 0; i < x.length; i++) {
    runTape(tape, r, x[i], cov, i);
    ddAddTo(y[i], 0, -r[f], -r[f + 1], e, 0);
    out[i] = e[0] + e[1];
    if (!Number.isFinite(out[i])) return false;
  }
  return true;
}
