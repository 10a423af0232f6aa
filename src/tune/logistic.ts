/**
 * L2-regularized logistic regression fitted by IRLS (Newton's method), with a small dense
 * Cholesky solve. Deterministic: no randomness, fixed iteration order.
 *
 * Objective minimized over coefficients w and intercept b:
 *   J(w, b) = - sum_i [ y_i log p_i + (1 - y_i) log(1 - p_i) ] + (l2 / 2) * ||w||^2,
 *   p_i = sigmoid(b + w . x_i).
 * The intercept is not penalized. Each Newton step is halved until J does not increase, so the
 * iteration is monotone even far from the optimum.
 */
import { DEFAULT_WEIGHTS, sigmoid } from "../score/combine.js";
import { FEATURE_NAMES, type Features, type Weights } from "../types.js";

/** Default L2 penalty: a unit-variance Gaussian prior on each weight, a mild shrink (common practice). */
export const DEFAULT_L2 = 1.0;
/** Default cap on Newton iterations: Newton converges in well under 30 on well-posed data. */
export const DEFAULT_MAX_ITERATIONS = 100;
/** Default tolerance: stop when the largest coefficient change of a step is below this. */
export const DEFAULT_TOLERANCE = 1e-10;
/** Added to the Hessian diagonal so the unpenalized intercept never makes it singular in floating point. */
const DIAGONAL_JITTER = 1e-12;
/** Step halvings tried before a step is accepted anyway (2^-30 is below any useful change). */
const MAX_HALVINGS = 30;

export interface LogisticOptions {
  /** L2 penalty on the coefficients (not the intercept); >= 0. Default DEFAULT_L2 (1.0). */
  l2?: number;
  /** Maximum Newton iterations. Default DEFAULT_MAX_ITERATIONS (100). */
  maxIterations?: number;
  /** Convergence tolerance on the largest coefficient change. Default DEFAULT_TOLERANCE (1e-10). */
  tolerance?: number;
}

export interface LogisticFit {
  intercept: number;
  coefficients: number[];
  iterations: number;
  converged: boolean;
  /** Final value of the objective J. */
  objective: number;
}

/** log(1 + exp(z)) without overflow. */
function softplus(z: number): number {
  return z > 0 ? z + Math.log1p(Math.exp(-z)) : Math.log1p(Math.exp(z));
}

/** The penalized negative log-likelihood J at (intercept b, coefficients w). */
export function logisticObjective(
  x: readonly number[][],
  y: readonly number[],
  b: number,
  w: readonly number[],
  l2: number,
): number {
  let j = 0;
  for (let i = 0; i < x.length; i++) {
    const z = linear(x[i]!, b, w);
    // -[y log p + (1-y) log(1-p)] = softplus(z) - y z
    j += softplus(z) - y[i]! * z;
  }
  let norm = 0;
  for (const c of w) norm += c * c;
  return j + (l2 / 2) * norm;
}

function linear(row: readonly number[], b: number, w: readonly number[]): number {
  let z = b;
  for (let j = 0; j < w.length; j++) z += w[j]! * row[j]!;
  return z;
}

/**
 * Solve A v = r for a symmetric positive-definite A by Cholesky (A = L L^T). Throws when A is
 * not positive definite.
 */
export function choleskySolve(a: readonly number[][], r: readonly number[]): number[] {
  const n = r.length;
  const l: number[][] = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  for (let i = 0; i < n; i++) {
    for (let j = 0; j <= i; j++) {
      let sum = a[i]![j]!;
      for (let k = 0; k < j; k++) sum -= l[i]![k]! * l[j]![k]!;
      if (i === j) {
        if (!(sum > 0)) throw new RangeError("choleskySolve: matrix is not positive definite");
        l[i]![i] = Math.sqrt(sum);
      } else {
        l[i]![j] = sum / l[j]![j]!;
      }
    }
  }
  const z = new Array<number>(n).fill(0);
  for (let i = 0; i < n; i++) {
    let sum = r[i]!;
    for (let k = 0; k < i; k++) sum -= l[i]![k]! * z[k]!;
    z[i] = sum / l[i]![i]!;
  }
  const v = new Array<number>(n).fill(0);
  for (let i = n - 1; i >= 0; i--) {
    let sum = z[i]!;
    for (let k = i + 1; k < n; k++) sum -= l[k]![i]! * v[k]!;
    v[i] = sum / l[i]![i]!;
  }
  return v;
}

/** Fit on rows `x` (each of the same length) with labels `y` in {0, 1}. */
export function fitLogistic(
  x: readonly number[][],
  y: readonly number[],
  opts: LogisticOptions = {},
): LogisticFit {
  const l2 = opts.l2 ?? DEFAULT_L2;
  const maxIterations = opts.maxIterations ?? DEFAULT_MAX_ITERATIONS;
  const tolerance = opts.tolerance ?? DEFAULT_TOLERANCE;
  if (!(l2 >= 0) || !Number.isFinite(l2))
    throw new RangeError(`fitLogistic: l2 must be a finite number >= 0, got ${l2}`);
  if (x.length !== y.length) throw new RangeError(`fitLogistic: ${x.length} rows but ${y.length} labels`);
  if (x.length === 0) throw new RangeError("fitLogistic: no rows to fit");
  const d = x[0]!.length;
  for (const [i, label] of y.entries())
    if (label !== 0 && label !== 1)
      throw new RangeError(`fitLogistic: label ${i} is ${label}, expected 0 or 1`);

  // Parameter vector theta = [b, w_1..w_d]; index 0 is the unpenalized intercept.
  const p = d + 1;
  let theta = new Array<number>(p).fill(0);
  let objective = logisticObjective(x, y, 0, theta.slice(1), l2);
  let converged = false;
  let iterations = 0;
  while (iterations < maxIterations) {
    iterations++;
    const grad = new Array<number>(p).fill(0);
    const hess: number[][] = Array.from({ length: p }, () => new Array<number>(p).fill(0));
    const w = theta.slice(1);
    for (let i = 0; i < x.length; i++) {
      const row = x[i]!;
      const prob = sigmoid(linear(row, theta[0]!, w));
      const resid = prob - y[i]!;
      const weight = prob * (1 - prob);
      for (let a = 0; a < p; a++) {
        const xa = a === 0 ? 1 : row[a - 1]!;
        grad[a]! += resid * xa;
        for (let c = 0; c <= a; c++) {
          const xc = c === 0 ? 1 : row[c - 1]!;
          hess[a]![c]! += weight * xa * xc;
        }
      }
    }
    for (let a = 0; a < p; a++) {
      for (let c = 0; c < a; c++) hess[c]![a] = hess[a]![c]!;
      hess[a]![a]! += DIAGONAL_JITTER;
      if (a > 0) {
        grad[a]! += l2 * theta[a]!;
        hess[a]![a]! += l2;
      }
    }
    const step = choleskySolve(hess, grad);
    let scale = 1;
    let next = theta.map((t, a) => t - step[a]!);
    let nextObjective = logisticObjective(x, y, next[0]!, next.slice(1), l2);
    for (let h = 0; h < MAX_HALVINGS && nextObjective > objective; h++) {
      scale /= 2;
      next = theta.map((t, a) => t - scale * step[a]!);
      nextObjective = logisticObjective(x, y, next[0]!, next.slice(1), l2);
    }
    const change = Math.max(...step.map((s) => Math.abs(s * scale)));
    theta = next;
    objective = nextObjective;
    if (change < tolerance) {
      converged = true;
      break;
    }
  }
  return { intercept: theta[0]!, coefficients: theta.slice(1), iterations, converged, objective };
}

/** One (mention, candidate) training pair: the candidate's features and whether it is the gold entity. */
export interface TrainingPair {
  features: Features;
  label: 0 | 1;
}

/** The feature vector in FEATURE_NAMES order. */
export function featureVector(f: Features): number[] {
  return FEATURE_NAMES.map((name) => f[name]);
}

/**
 * Fit combination weights (bias + one weight per named feature) on labeled candidate pairs. A
 * feature that is 0 on every pair (nearSpelling on a table with no crowded names) tells the fit
 * nothing, so it keeps its weight from `unseen` (default: DEFAULT_WEIGHTS) instead of the fit's 0.
 */
export function fitWeights(
  pairs: readonly TrainingPair[],
  opts: LogisticOptions = {},
  unseen: Weights["features"] = DEFAULT_WEIGHTS.features,
): { weights: Weights; fit: LogisticFit } {
  const rows = pairs.map((pair) => featureVector(pair.features));
  const fit = fitLogistic(
    rows,
    pairs.map((pair) => pair.label),
    opts,
  );
  const features = Object.fromEntries(
    FEATURE_NAMES.map((name, i) => [
      name,
      rows.some((r) => r[i] !== 0) ? fit.coefficients[i]! : unseen[name],
    ]),
  ) as Weights["features"];
  return { weights: { bias: fit.intercept, features }, fit };
}
