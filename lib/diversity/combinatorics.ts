// Log-space special functions for the diversity engine. Counts reach the millions, so
// every binomial ratio is formed from differences of log-factorials that are computed
// without cancelling two huge log-gamma values against each other.

const HALF_LN_2PI = 0.9189385332046728; // ln(2π)/2

/** Stirling-series remainder of ln Γ(z) for z ≥ 15 (Abramowitz & Stegun 1964, 6.1.41). */
export function stirlingTail(z: number): number {
  const r = 1 / z;
  const r2 = r * r;
  return r * (1 / 12 - r2 * (1 / 360 - r2 * (1 / 1260 - r2 * (1 / 1680 - r2 * (1 / 1188 - r2 * (691 / 360360))))));
}

/** ln Γ(x) for x > 0, about 1e-15 relative accuracy. */
export function lnGamma(x: number): number {
  if (!(x > 0)) return x === 0 ? Infinity : NaN;
  let shift = 0;
  let prod = 1;
  let z = x;
  while (z < 15) {
    prod *= z;
    z += 1;
    if (prod > 1e280) {
      shift += Math.log(prod);
      prod = 1;
    }
  }
  shift += Math.log(prod);
  return (z - 0.5) * Math.log(z) - z + HALF_LN_2PI + stirlingTail(z) - shift;
}

const FACTORIAL_TABLE_SIZE = 256;
let lnFactorialTable: Float64Array | null = null;

/** ln(k!) for an integer k ≥ 0. */
export function lnFactorial(k: number): number {
  if (k < FACTORIAL_TABLE_SIZE) {
    if (lnFactorialTable === null) {
      const t = new Float64Array(FACTORIAL_TABLE_SIZE);
      for (let i = 2; i < FACTORIAL_TABLE_SIZE; i++) t[i] = lnGamma(i + 1);
      lnFactorialTable = t;
    }
    return lnFactorialTable[k] ?? 0;
  }
  return lnGamma(k + 1);
}

/**
 * ln(x! / y!) for integers x ≥ y ≥ 0. The Stirling difference
 * (X−½)·log1p((X−Y)/Y) + (X−Y)(ln Y − 1) + tail(X) − tail(Y), with X = x+1, Y = y+1,
 * keeps full relative accuracy where lnΓ(x+1) − lnΓ(y+1) would lose digits.
 */
export function lnFactorialRatio(x: number, y: number): number {
  const d = x - y;
  if (d <= 0) return 0;
  if (d <= 8) {
    let p = 1;
    for (let j = y + 1; j <= x; j++) p *= j;
    return Math.log(p);
  }
  if (y < 15) return lnFactorial(x) - lnFactorial(y);
  const X = x + 1;
  const Y = y + 1;
  return (X - 0.5) * Math.log1p(d / Y) + d * (Math.log(Y) - 1) + stirlingTail(X) - stirlingTail(Y);
}

/** ln C(n, k) for integers 0 ≤ k ≤ n. */
export function lnChoose(n: number, k: number): number {
  if (k < 0 || k > n) return -Infinity;
  const small = Math.min(k, n - k);
  return lnFactorialRatio(n, n - small) - lnFactorial(small);
}

/**
 * ln[ C(N−k, m) / C(N, m) ]: the log probability that a class of k items is entirely
 * missed by a draw of m out of N without replacement (Hurlbert 1971). −Infinity when
 * N − k < m. The ratio is symmetric in k and m: ln[(N−m)!/(N−m−k)!] − ln[N!/(N−k)!].
 */
export function lnChooseRatio(N: number, k: number, m: number): number {
  if (k <= 0 || m <= 0) return 0;
  if (N - k < m) return -Infinity;
  const small = Math.min(k, m);
  const large = Math.max(k, m);
  if (small <= 8) {
    // Σ_{j<small} log1p(−large/(N−j)): symmetric in k and m, no cancellation at all.
    let s = 0;
    for (let j = 0; j < small; j++) s += Math.log1p(-large / (N - j));
    return s;
  }
  // Both forms are exact; the one whose terms have size min(k, m)·ln N cancels least.
  return lnFactorialRatio(N - large, N - large - small) - lnFactorialRatio(N, N - small);
}

/**
 * Σ_{j=a}^{b−1} 1/j = ψ(b) − ψ(a) for integers 1 ≤ a ≤ b, without cancellation
 * (asymptotic digamma series, Abramowitz & Stegun 1964, 6.3.18).
 */
export function harmonicDifference(a: number, b: number): number {
  if (b <= a) return 0;
  let s = 0;
  let lo = a;
  if (b - a <= 32) {
    for (let j = b - 1; j >= a; j--) s += 1 / j;
    return s;
  }
  while (lo < 16) {
    s += 1 / lo;
    lo += 1;
  }
  return s + Math.log1p((b - lo) / lo) - digammaTail(b) + digammaTail(lo);
}

/** ln z − ψ(z) for z ≥ 16 (asymptotic series; Abramowitz & Stegun 1964, 6.3.18). */
function digammaTail(z: number): number {
  const r = 1 / z;
  const r2 = r * r;
  return r / 2 + r2 * (1 / 12 - r2 * (1 / 120 - r2 * (1 / 252 - r2 * (1 / 240 - r2 * (1 / 132)))));
}

/** e^z·E1(z) for z > 0 (series below 1, Lentz continued fraction above; Press et al. 2007, §6.3). */
export function scaledExpIntegralE1(z: number): number {
  if (z <= 1) {
    const EULER = 0.5772156649015329;
    let sum = 0;
    let term = 1;
    for (let k = 1; k < 200; k++) {
      term *= -z / k;
      const add = term / k;
      sum += add;
      if (Math.abs(add) < 1e-17 * Math.abs(sum)) break;
    }
    return Math.exp(z) * (-EULER - Math.log(z) - sum);
  }
  const TINY = 1e-300;
  let b = z + 1;
  let c = 1 / TINY;
  let d = 1 / b;
  let h = d;
  for (let i = 1; i < 10000; i++) {
    const an = -i * i;
    b += 2;
    d = 1 / (an * d + b);
    c = b + an / c;
    const del = c * d;
    h *= del;
    if (Math.abs(del - 1) <= 4e-16) break; // a few ulps: a stricter test may never be met
  }
  return h;
}

/**
 * W(n, A) = Σ_{j≥0} (1−A)^{j+1} / (n+j) = (1−A)^{1−n} [−ln A − Σ_{r=1}^{n−1} (1−A)^r / r],
 * the bracketed term of the Chao, Wang & Jost (2013) entropy estimator, for integer n ≥ 1
 * and 0 < A ≤ 1. Direct sums where they converge quickly; otherwise the Euler–Maclaurin
 * expansion of Σ_{r≥n} e^{−λr}/r, λ = −ln(1−A), around the exponential integral E1(λn).
 */
export function logSeriesTail(n: number, A: number): number {
  if (A >= 1) return 0;
  if (!(A > 0)) return Infinity;
  const x = 1 - A;
  const lambda = -Math.log1p(-A);
  if (lambda >= 0.02) {
    // Geometric decay: terms fall below 1e-17 of the first after 40/λ ≤ 2,000 steps.
    let s = 0;
    let p = x;
    for (let j = 0; j < 100000; j++) {
      const t = p / (n + j);
      s += t;
      if (t < 1e-18 * s) break;
      p *= x;
    }
    return s;
  }
  if (n < 200) {
    // Direct form; its cancellation is mild because −ln A stays below ~40.
    let s = 0;
    let p = 1;
    for (let r = 1; r < n; r++) {
      p *= x;
      s += p / r;
    }
    return Math.exp((1 - n) * Math.log1p(-A)) * (-Math.log(A) - s);
  }
  // Euler–Maclaurin: Σ_{r≥n} g(r) = ∫_n^∞ g + g(n)/2 − Σ_k B_{2k}/(2k)! g^{(2k−1)}(n), with
  // g(r) = e^{−λr}/r, every term scaled by e^{λn}; g is completely monotone, so the error
  // is below the first omitted term, here < 1e-20 because λ + 1/n < 0.025.
  const BERNOULLI_OVER_FACT = [1 / 12, -1 / 720, 1 / 30240, -1 / 1209600, 1 / 47900160]; // B_{2k}/(2k)!
  let sum = scaledExpIntegralE1(lambda * n) + 0.5 / n;
  for (let k = 1; k <= BERNOULLI_OVER_FACT.length; k++) {
    const order = 2 * k - 1;
    // e^{λn} g^{(order)}(n) = (−1)^order Σ_{j=0}^{order} order!/(order−j)! λ^{order−j} / n^{j+1}
    let deriv = 0;
    let falling = 1;
    for (let j = 0; j <= order; j++) {
      if (j > 0) falling *= order - j + 1;
      deriv += (falling * Math.pow(lambda, order - j)) / Math.pow(n, j + 1);
    }
    deriv = -deriv; // odd order
    sum -= (BERNOULLI_OVER_FACT[k - 1] ?? 0) * deriv;
  }
  // Σ_{j≥0} x^{j+1}/(n+j) = e^{λ(n−1)} Σ_{r≥n} e^{−λr}/r = e^{−λ} · (scaled sum).
  return x * sum;
}

/**
 * ln[Γ(x + a)/Γ(x)] for x > 0, x + a > 0 and real a, without cancelling two large log-gamma
 * values: for x ≥ 15 the Stirling difference (x+a−½)·log1p(a/x) + a(ln x − 1) + tail(x+a) − tail(x)
 * (Abramowitz & Stegun 1964, 6.1.41), as in lnFactorialRatio.
 */
export function lnGammaRatio(x: number, a: number): number {
  if (a === 0) return 0;
  if (x < 15 || x + a < 15) return lnGamma(x + a) - lnGamma(x);
  return (x + a - 0.5) * Math.log1p(a / x) + a * (Math.log(x) - 1) + stirlingTail(x + a) - stirlingTail(x);
}
