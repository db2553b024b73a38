/**
 * A small seeded pseudo-random generator for the model families: xoshiro128** (Blackman & Vigna,
 * "Scrambled linear pseudorandom number generators", ACM TOMS 2021), seeded through splitmix32 so
 * that nearby seeds give unrelated streams. Deterministic across platforms (32-bit integer
 * arithmetic only); not for cryptography.
 */
export class Prng {
  private a: number;
  private b: number;
  private c: number;
  private d: number;

  constructor(seed: number) {
    let x = seed >>> 0;
    const next = (): number => {
      // splitmix32 (common practice, no source beyond the splitmix64 constants' folklore)
      x = (x + 0x9e3779b9) >>> 0;
      let z = x;
      z = Math.imul(z ^ (z >>> 16), 0x85ebca6b);
      z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35);
      return (z ^ (z >>> 16)) >>> 0;
    };
    this.a = next();
    this.b = next();
    this.c = next();
    this.d = next();
    if ((this.a | this.b | this.c | this.d) === 0) this.a = 1;
  }

  /** A uniform 32-bit unsigned integer. */
  nextU32(): number {
    const r = Math.imul(rotl(Math.imul(this.b, 5), 7), 9) >>> 0;
    const t = this.b << 9;
    this.c ^= this.a;
    this.d ^= this.b;
    this.b ^= this.c;
    this.a ^= this.d;
    this.c ^= t;
    this.d = rotl(this.d, 11);
    return r;
  }

  /** Uniform in [0, 1), 32 bits of resolution. */
  next(): number {
    return this.nextU32() / 4294967296;
  }

  /** Uniform integer in [0, n), n ≤ 2^32 (multiply-shift; the bias is below n / 2^32). */
  int(n: number): number {
    return Math.floor(this.next() * n);
  }
}

function rotl(x: number, k: number): number {
  return ((x << k) | (x >>> (32 - k))) >>> 0;
}
