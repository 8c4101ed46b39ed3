// Forward-mode dual numbers: a value with its gradient over a few frequency counts.
// They give exact derivatives for the delta-method variances (ACE, ICE, jack2, the
// extrapolated curves) without deriving each gradient by hand.

export class Dual {
  constructor(
    readonly v: number,
    readonly g: Float64Array,
  ) {}

  static constant(v: number, dims: number): Dual {
    return new Dual(v, new Float64Array(dims));
  }

  /** The `index`-th independent variable with value v. */
  static variable(v: number, index: number, dims: number): Dual {
    const g = new Float64Array(dims);
    g[index] = 1;
    return new Dual(v, g);
  }

  private combine(o: Dual, a: number, b: number, v: number): Dual {
    const g = new Float64Array(this.g.length);
    for (let i = 0; i < g.length; i++) g[i] = a * (this.g[i] ?? 0) + b * (o.g[i] ?? 0);
    return new Dual(v, g);
  }

  add(o: Dual | number): Dual {
    if (typeof o === "number") return new Dual(this.v + o, this.g);
    return this.combine(o, 1, 1, this.v + o.v);
  }

  sub(o: Dual | number): Dual {
    if (typeof o === "number") return new Dual(this.v - o, this.g);
    return this.combine(o, 1, -1, this.v - o.v);
  }

  mul(o: Dual | number): Dual {
    if (typeof o === "number") return this.scale(o, this.v * o);
    return this.combine(o, o.v, this.v, this.v * o.v);
  }

  div(o: Dual | number): Dual {
    if (typeof o === "number") return this.scale(1 / o, this.v / o);
    const q = this.v / o.v;
    return this.combine(o, 1 / o.v, -q / o.v, q);
  }

  /** this^p for a constant p (this > 0, or p a positive integer). */
  pow(p: number): Dual {
    if (p === 0) return Dual.constant(1, this.g.length);
    const v = Math.pow(this.v, p);
    return this.scale(p * Math.pow(this.v, p - 1), v);
  }

  private scale(k: number, v: number): Dual {
    const g = new Float64Array(this.g.length);
    for (let i = 0; i < g.length; i++) g[i] = k * (this.g[i] ?? 0);
    return new Dual(v, g);
  }
}

/**
 * Delta-method variance under the multinomial model for frequency counts
 * (Chao 1987; Chao & Lee 1992): cov(f_i, f_j) = f_i(δ_ij − f_j/Ŝ), so
 * var(Ŝ) = Σ d_i² f_i − (Σ d_i f_i)² / Ŝ, with d_i = ∂Ŝ/∂f_i.
 */
export function deltaVariance(grad: ArrayLike<number>, freqs: ArrayLike<number>, shat: number): number {
  if (!(shat > 0)) return 0;
  let sdd = 0;
  let sd = 0;
  for (let i = 0; i < freqs.length; i++) {
    const d = grad[i] ?? 0;
    const f = freqs[i] ?? 0;
    sdd += d * d * f;
    sd += d * f;
  }
  return Math.max(sdd - (sd * sd) / shat, 0);
}
