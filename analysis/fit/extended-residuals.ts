import { parse, type MathNode } from 'mathjs';
import { ddAdd as add, ddDiv as div, ddExp as exp, ddLog as log, ddMul as mul, ddNeg as neg, ddPow as pow, ddPowInt as powInt, ddSqrt as sqrt, type Dd } from './double-double';

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

type Evaluator = (p: ArrayLike<number>, xi: number, ci: number[]) => Dd;

function build(node: MathNode, parameters: string[], covariates: string[]): Evaluator {
  const n = node as MathNode & { fn?: unknown; args?: MathNode[]; name?: string; value?: unknown; content?: MathNode };
  switch (node.type) {
    case 'ConstantNode': {
      const v: Dd = [Number(n.value), 0];
      return () => v;
    }
    case 'SymbolNode': {
      const name = n.name as string;
      if (name === 'x') return (_p, xi) => [xi, 0];
      const c = covariates.indexOf(name);
      if (c >= 0) return (_p, _x, ci) => [ci[c], 0];
      const k = parameters.indexOf(name);
      if (k >= 0) return (p) => [p[k], 0];
      if (name === 'pi' || name === 'PI') return () => [Math.PI, 1.2246467991473532e-16];
      if (name === 'e' || name === 'E') return () => [Math.E, 1.4456468917292502e-16];
      if (name === 'tau') return () => [2 * Math.PI, 2.4492935982947064e-16];
      throw new Error(`unknown symbol ${name}`);
    }
    case 'ParenthesisNode':
      return build(n.content as MathNode, parameters, covariates);
    case 'OperatorNode': {
      const args = (n.args as MathNode[]).map((a) => build(a, parameters, covariates));
      const [f, g] = args;
      switch (n.fn as string) {
        case 'add': return (p, x, c) => add(f(p, x, c), g(p, x, c));
        case 'subtract': return (p, x, c) => add(f(p, x, c), neg(g(p, x, c)));
        case 'multiply': return (p, x, c) => mul(f(p, x, c), g(p, x, c));
        case 'divide': return (p, x, c) => div(f(p, x, c), g(p, x, c));
        case 'pow': return (p, x, c) => pow(f(p, x, c), g(p, x, c));
        case 'unaryMinus': return (p, x, c) => neg(f(p, x, c));
        case 'unaryPlus': return f;
        default: throw new Error(`operator ${String(n.fn)}`);
      }
    }
    case 'FunctionNode': {
      const name = (n.fn as { name?: string }).name ?? '';
      const args = (n.args as MathNode[]).map((a) => build(a, parameters, covariates));
      const [f, g] = args;
      if (name === 'exp') return (p, x, c) => exp(f(p, x, c));
      if (name === 'log' && args.length === 1) return (p, x, c) => log(f(p, x, c));
      if (name === 'sqrt') return (p, x, c) => sqrt(f(p, x, c));
      if (name === 'pow') return (p, x, c) => pow(f(p, x, c), g(p, x, c));
      if (name === 'square') return (p, x, c) => powInt(f(p, x, c), 2);
      if (name === 'cube') return (p, x, c) => powInt(f(p, x, c), 3);
      const dbl = DOUBLE_FUNCTIONS[name];
      if (name === 'log') return (p, x, c) => [Math.log(f(p, x, c)[0]) / Math.log(g(p, x, c)[0]), 0];
      if (!dbl) throw new Error(`function ${name}`);
      return (p, x, c) => [dbl(...args.map((a) => { const v = a(p, x, c); return v[0] + v[1]; })), 0];
    }
    default:
      throw new Error(`node ${node.type}`);
  }
}

const cache = new Map<string, Evaluator | null>();

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
  let ev = cache.get(key);
  if (ev === undefined) {
    try {
      ev = build(parse(expression), parameters, covariates);
    } catch {
      ev = null;
    }
    if (cache.size > 200) cache.clear();
    cache.set(key, ev);
  }
  if (!ev) return false;
  const ci = new Array<number>(covariates.length);
  for (let i = 0; i < x.length; i++) {
    for (let c = 0; c < covariates.length; c++) ci[c] = cov[c][i];
    const f = ev(p, x[i], ci);
    const r = add([y[i], 0], neg(f));
    out[i] = r[0] + r[1];
    if (!Number.isFinite(out[i])) return false;
  }
  return true;
}
