/**
 * Mersenne Twister MT19937 — Matsumoto & Nishimura, "Mersenne Twister: a 623-dimensionally
 * equidistributed uniform pseudo-random number generator", ACM TOMACS 8(1), 1998, pp. 3–30.
 * A port of their reference C code (mt19937ar.c, 2002 revision): `init_genrand` seeding,
 * `genrand_int32` and `genrand_res53`. The constants (624, 397, 0x9908b0df, the tempering masks,
 * 1812433253) are theirs. numpy's legacy `RandomState(seed).random_sample()` is this exact stream.
 */
import { requireSeed } from "./validate";

export interface Rng {
  /** The next 32-bit output of genrand_int32, an integer in [0, 2^32). */
  nextUint32(): number;
  /** The next genrand_res53 double, a multiple of 2^-53 in [0, 1); consumes two 32-bit outputs. */
  nextDouble(): number;
}

const N = 624;
const M = 397;
const MATRIX_A = 0x9908b0df;
const UPPER_MASK = 0x80000000;
const LOWER_MASK = 0x7fffffff;

function twist(mt: Uint32Array): void {
  let k = 0;
  let y: number;
  for (; k < N - M; k++) {
    y = (mt[k]! & UPPER_MASK) | (mt[k + 1]! & LOWER_MASK);
    mt[k] = mt[k + M]! ^ (y >>> 1) ^ (y & 1 ? MATRIX_A : 0);
  }
  for (; k < N - 1; k++) {
    y = (mt[k]! & UPPER_MASK) | (mt[k + 1]! & LOWER_MASK);
    mt[k] = mt[k + (M - N)]! ^ (y >>> 1) ^ (y & 1 ? MATRIX_A : 0);
  }
  y = (mt[N - 1]! & UPPER_MASK) | (mt[0]! & LOWER_MASK);
  mt[N - 1] = mt[M - 1]! ^ (y >>> 1) ^ (y & 1 ? MATRIX_A : 0);
}

class MersenneTwister implements Rng {
  private readonly mt = new Uint32Array(N);
  private index = N;

  constructor(seed: number) {
    const mt = this.mt;
    mt[0] = seed >>> 0;
    for (let i = 1; i < N; i++) {
      const prev = mt[i - 1]! ^ (mt[i - 1]! >>> 30);
      mt[i] = (Math.imul(1812433253, prev) + i) >>> 0;
    }
  }

  nextUint32(): number {
    if (this.index >= N) {
      twist(this.mt);
      this.index = 0;
    }
    let y = this.mt[this.index++]!;
    y ^= y >>> 11;
    y ^= (y << 7) & 0x9d2c5680;
    y ^= (y << 15) & 0xefc60000;
    y ^= y >>> 18;
    return y >>> 0;
  }

  nextDouble(): number {
    const a = this.nextUint32() >>> 5;
    const b = this.nextUint32() >>> 6;
    return (a * 67108864 + b) / 9007199254740992;
  }
}

/**
 * Creates an MT19937 stream seeded by the reference `init_genrand(seed)`.
 *
 * @param seed integer 0..4294967295 (the domain of init_genrand's 32-bit seed).
 * @throws {TypeError} when `seed` is not a number.
 * @throws {RangeError} when `seed` is not an integer in 0..4294967295.
 * @example
 * const rng = createRng(5489);
 * rng.nextUint32(); // → 3499211612
 * createRng(5489).nextDouble(); // → 0.8147236863931789
 */
export function createRng(seed: number): Rng {
  return new MersenneTwister(requireSeed("seed", seed));
}
