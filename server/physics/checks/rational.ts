/** Exact fractions for symbolic prefactors (15 (p+1) / [16 (2p-8)(2p-5)] must not become a float). */
export class Rational {
  readonly num: bigint;
  readonly den: bigint;

  constructor(num: bigint, den: bigint = 1n) {
    if (den === 0n) throw new RangeError("zero denominator");
    const sign = den < 0n ? -1n : 1n;
    const g = gcd(num < 0n ? -num : num, den < 0n ? -den : den) || 1n;
    this.num = (sign * num) / g;
    this.den = (sign * den) / g;
  }

  static of(n: number | bigint, d: number | bigint = 1): Rational {
    return new Rational(BigInt(n), BigInt(d));
  }

  /**
   * The fraction a decimal order such as 1.5 or -0.5 stands for (denominator at most 1000);
   * undefined when the number is not such a fraction.
   */
  static fromNumber(x: number): Rational | undefined {
    if (!Number.isFinite(x)) return undefined;
    for (let q = 1; q <= 1000; q += 1) {
      const p = Math.round(x * q);
      if (Math.abs(p / q - x) <= 1e-12 * Math.max(1, Math.abs(x))) return Rational.of(p, q);
    }
    return undefined;
  }

  add(o: Rational): Rational {
    return new Rational(this.num * o.den + o.num * this.den, this.den * o.den);
  }
  sub(o: Rational): Rational {
    return new Rational(this.num * o.den - o.num * this.den, this.den * o.den);
  }
  mul(o: Rational): Rational {
    return new Rational(this.num * o.num, this.den * o.den);
  }
  div(o: Rational): Rational {
    return new Rational(this.num * o.den, this.den * o.num);
  }
  neg(): Rational {
    return new Rational(-this.num, this.den);
  }
  isZero(): boolean {
    return this.num === 0n;
  }
  isInteger(): boolean {
    return this.den === 1n;
  }
  equals(o: Rational): boolean {
    return this.num === o.num && this.den === o.den;
  }
  toNumber(): number {
    return Number(this.num) / Number(this.den);
  }
  /** "-3/224", "2", for messages. */
  toString(): string {
    return this.den === 1n ? this.num.toString() : `${this.num}/${this.den}`;
  }
  /** As an operand in our expression syntax: "(3/224)", "(-2/5)", "7", "(-7)". */
  toExpression(): string {
    if (this.den === 1n) return this.num < 0n ? `(${this.num})` : this.num.toString();
    return `(${this.num}/${this.den})`;
  }
  /** LaTeX: \frac{3}{224}, -\frac{2}{5}, 7. */
  toLatex(): string {
    if (this.den === 1n) return this.num.toString();
    const abs = this.num < 0n ? -this.num : this.num;
    return `${this.num < 0n ? "-" : ""}\\frac{${abs}}{${this.den}}`;
  }
}

function gcd(a: bigint, b: bigint): bigint {
  while (b !== 0n) [a, b] = [b, a % b];
  return a;
}
