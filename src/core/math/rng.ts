/**
 * Seeded pseudo-random numbers: the Mersenne Twister MT19937 of Matsumoto & Nishimura (1998),
 * seeded by their init_genrand, with 53-bit uniforms (genrand_res53) and standard normal draws
 * by the Marsaglia polar method, one pair at a time with the second kept for the next call.
 * This matches, draw for draw, the legacy generator of numpy (`numpy.random.RandomState`),
 * which the reference fixtures use as an outside check.
 */
export interface Rng {
  /** Uniform on [0, 1), 53-bit resolution. */
  uniform(): number;
  /** Standard normal. */
  normal(): number;
  /** Uniform integer in [0, n). */
  integer(n: number): number;
}

const N = 624;
const M = 397;
const MATRIX_A = 0x9908b0df;
const UPPER = 0x80000000;
const LOWER = 0x7fffffff;

export class MersenneTwister implements Rng {
  private readonly mt = new Uint32Array(N);
  private mti = N + 1;
  private spare = 0;
  private hasSpare = false;

  constructor(seed: number) {
    if (!Number.isInteger(seed) || seed < 0 || seed > 0xffffffff) {
      throw new RangeError(`seed must be an integer in [0, 2^32 - 1], got ${seed}`);
    }
    const mt = this.mt;
    mt[0] = seed >>> 0;
    for (let i = 1; i < N; i++) {
      const prev = mt[i - 1] ^ (mt[i - 1] >>> 30);
      // 1812433253 * prev + i, mod 2^32, split to stay inside exact double arithmetic.
      mt[i] = (((((prev & 0xffff0000) >>> 16) * 1812433253) << 16) + (prev & 0x0000ffff) * 1812433253 + i) >>> 0;
    }
    this.mti = N;
  }

  /** Next 32-bit unsigned integer (genrand_int32). */
  nextUint32(): number {
    const mt = this.mt;
    if (this.mti >= N) {
      let kk = 0;
      let y: number;
      for (; kk < N - M; kk++) {
        y = (mt[kk] & UPPER) | (mt[kk + 1] & LOWER);
        mt[kk] = mt[kk + M] ^ (y >>> 1) ^ (y & 1 ? MATRIX_A : 0);
      }
      for (; kk < N - 1; kk++) {
        y = (mt[kk] & UPPER) | (mt[kk + 1] & LOWER);
        mt[kk] = mt[kk + (M - N)] ^ (y >>> 1) ^ (y & 1 ? MATRIX_A : 0);
      }
      y = (mt[N - 1] & UPPER) | (mt[0] & LOWER);
      mt[N - 1] = mt[M - 1] ^ (y >>> 1) ^ (y & 1 ? MATRIX_A : 0);
      this.mti = 0;
    }
    let y = mt[this.mti++];
    // Tempering.
    y ^= y >>> 11;
    y ^= (y << 7) & 0x9d2c5680;
    y ^= (y << 15) & 0xefc60000;
    y ^= y >>> 18;
    return y >>> 0;
  }

  uniform(): number {
    const a = this.nextUint32() >>> 5;
    const b = this.nextUint32() >>> 6;
    return (a * 67108864 + b) / 9007199254740992;
  }

  normal(): number {
    if (this.hasSpare) {
      this.hasSpare = false;
      return this.spare;
    }
    let x1: number;
    let x2: number;
    let r2: number;
    do {
      x1 = 2 * this.uniform() - 1;
      x2 = 2 * this.uniform() - 1;
      r2 = x1 * x1 + x2 * x2;
    } while (r2 >= 1 || r2 === 0);
    const f = Math.sqrt((-2 * Math.log(r2)) / r2);
    this.spare = f * x1;
    this.hasSpare = true;
    return f * x2;
  }

  integer(n: number): number {
    if (!Number.isInteger(n) || n <= 0) throw new RangeError(`integer bound must be a positive integer, got ${n}`);
    return Math.floor(this.uniform() * n);
  }
}

/** The generator every model uses unless told otherwise; the seed is part of a run's options. */
export function createRng(seed = 20260101): Rng {
  return new MersenneTwister(seed);
}
