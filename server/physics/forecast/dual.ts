/**
 * Forward-mode derivatives with three infinitesimals, for the TaylorF2 coefficients as functions of
 * (mass-ratio parameter, chi_s, chi_a). The coefficients are typed once (phase-coefficients.ts) and
 * their exact partial derivatives come out of the same arithmetic, so a derivative can never drift
 * from the coefficient it belongs to. Used once per source, never per frequency point.
 */
export class Dual {
  constructor(
    readonly v: number,
    readonly d0 = 0,
    readonly d1 = 0,
    readonly d2 = 0,
  ) {}

  static of(x: number | Dual): Dual {
    return typeof x === "number" ? new Dual(x) : x;
  }

  add(o: number | Dual): Dual {
    const b = Dual.of(o);
    return new Dual(this.v + b.v, this.d0 + b.d0, this.d1 + b.d1, this.d2 + b.d2);
  }

  sub(o: number | Dual): Dual {
    const b = Dual.of(o);
    return new Dual(this.v - b.v, this.d0 - b.d0, this.d1 - b.d1, this.d2 - b.d2);
  }

  mul(o: number | Dual): Dual {
    if (typeof o === "number") return new Dual(this.v * o, this.d0 * o, this.d1 * o, this.d2 * o);
    return new Dual(
      this.v * o.v,
      this.d0 * o.v + this.v * o.d0,
      this.d1 * o.v + this.v * o.d1,
      this.d2 * o.v + this.v * o.d2,
    );
  }

  /** x^p for a constant exponent (x > 0 where p is not an integer). */
  pow(p: number): Dual {
    const value = this.v ** p;
    const slope = p === 0 ? 0 : p * this.v ** (p - 1);
    return new Dual(value, slope * this.d0, slope * this.d1, slope * this.d2);
  }

  sqrt(): Dual {
    const value = Math.sqrt(this.v);
    const slope = 0.5 / value;
    return new Dual(value, slope * this.d0, slope * this.d1, slope * this.d2);
  }

  log(): Dual {
    const slope = 1 / this.v;
    return new Dual(Math.log(this.v), slope * this.d0, slope * this.d1, slope * this.d2);
  }

  exp(): Dual {
    const value = Math.exp(this.v);
    return new Dual(value, value * this.d0, value * this.d1, value * this.d2);
  }

  /** Partial derivative with respect to infinitesimal i (0, 1, 2). */
  d(i: 0 | 1 | 2): number {
    return i === 0 ? this.d0 : i === 1 ? this.d1 : this.d2;
  }
}

/** Sum of a polynomial c0 + c1 x + c2 x^2 + ... in a dual variable. */
export function poly(x: Dual, coefficients: readonly number[]): Dual {
  let acc = new Dual(0);
  for (let i = coefficients.length - 1; i >= 0; i--) acc = acc.mul(x).add(coefficients[i]!);
  return acc;
}
