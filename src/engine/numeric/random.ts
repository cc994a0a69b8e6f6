/**
 * Seeded random numbers, identical on every machine: xoshiro128** (Blackman &
 * Vigna 2018, "Scrambled linear pseudorandom number generators") on 32-bit
 * integer arithmetic, seeded through splitmix32; normals by the Box–Muller
 * transform (Box & Muller 1958), both values of each pair used. The integer
 * stream uses only Math.imul, shifts and exact double arithmetic, so uniforms,
 * signs and shuffles are identical everywhere. Normals also use Math.log,
 * Math.sin and Math.cos, which ECMAScript does not require to be correctly
 * rounded: Node's V8 computes them with its own fixed (fdlibm-derived) code,
 * so they agree across machines running Node, but another JavaScript engine
 * could differ in the last bit (a p-value, a count, moves only if a draw
 * lands within rounding of the statistic).
 *
 * @example
 *   const rng = new Random(1);
 *   rng.uniform();   // in [0, 1)
 *   rng.normal();    // standard normal
 */
export class Random {
  private s0: number;
  private s1: number;
  private s2: number;
  private s3: number;
  private spare: number | null = null;

  constructor(seed: number) {
    let z = seed >>> 0;
    const next = (): number => {
      // splitmix32
      z = (z + 0x9e3779b9) >>> 0;
      let t = z;
      t = Math.imul(t ^ (t >>> 16), 0x85ebca6b);
      t = Math.imul(t ^ (t >>> 13), 0xc2b2ae35);
      return (t ^ (t >>> 16)) >>> 0;
    };
    this.s0 = next();
    this.s1 = next();
    this.s2 = next();
    this.s3 = next();
    if ((this.s0 | this.s1 | this.s2 | this.s3) === 0) this.s0 = 1;
  }

  /** Next 32-bit unsigned integer. */
  nextUint32(): number {
    const result = Math.imul(rotl(Math.imul(this.s1, 5), 7), 9) >>> 0;
    const t = this.s1 << 9;
    this.s2 ^= this.s0;
    this.s3 ^= this.s1;
    this.s1 ^= this.s2;
    this.s0 ^= this.s3;
    this.s2 ^= t;
    this.s3 = rotl(this.s3, 11);
    return result;
  }

  /** Uniform on [0, 1) with 53 random bits. */
  uniform(): number {
    const hi = this.nextUint32() >>> 5; // 27 bits
    const lo = this.nextUint32() >>> 6; // 26 bits
    return (hi * 67108864 + lo) / 9007199254740992;
  }

  /** Uniform integer in 0..n−1 by floor(uniform·n) (53 random bits: bias below 2⁻²¹ for n ≤ 2³²). */
  integer(n: number): number {
    return Math.floor(this.uniform() * n);
  }

  /** Standard normal draw (Box–Muller). */
  normal(): number {
    if (this.spare !== null) {
      const v = this.spare;
      this.spare = null;
      return v;
    }
    let u = 0;
    while (u === 0) u = this.uniform();
    const v = this.uniform();
    const r = Math.sqrt(-2 * Math.log(u));
    this.spare = r * Math.sin(2 * Math.PI * v);
    return r * Math.cos(2 * Math.PI * v);
  }

  /** +1 or −1 with equal probability. */
  sign(): number {
    return this.nextUint32() & 1 ? 1 : -1;
  }

  /** Fisher–Yates shuffle in place. */
  shuffle<T extends { length: number; [i: number]: number }>(a: T): T {
    for (let i = a.length - 1; i > 0; i--) {
      const j = this.integer(i + 1);
      const t = a[i];
      a[i] = a[j];
      a[j] = t;
    }
    return a;
  }
}

function rotl(x: number, k: number): number {
  return (x << k) | (x >>> (32 - k));
}
