/**
 * The sampler's only source of randomness. Every random number of a run (walker split, stretch factors,
 * move choice, accept/reject uniforms, initial balls) is drawn here, in the main thread, in a fixed
 * order: workers only evaluate. So a chain depends on the seed alone, never on the number of workers, and
 * saving `state` is enough to resume it exactly.
 *
 * The generator is stdlib's 32-bit Mersenne Twister (Matsumoto & Nishimura 1998), through stdlib's improved
 * ziggurat (Doornik 2005) for normal deviates; the ziggurat keeps no state of its own beyond its twister,
 * whose uniforms (`randn.PRNG`, 53-bit resolution in [0, 1)) are also ours, so one state array covers both.
 */
import zigguratFactory from '@stdlib/random-base-improved-ziggurat';

type Ziggurat = ReturnType<typeof zigguratFactory.factory>;

export class SamplerRng {
  private readonly randn: Ziggurat;
  private readonly randu: () => number;

  private constructor(randn: Ziggurat) {
    this.randn = randn;
    this.randu = randn.PRNG;
  }

  /**
   * The generator of ensemble `stream` of a run seeded with `seed` (an integer in [0, 2^32)). Each stream
   * is seeded with the pair (seed, stream) through Mersenne Twister's array initialisation
   * (`init_by_array`, Matsumoto & Nishimura 1998), so that streams of one run, and runs of adjacent seeds,
   * start from unrelated states.
   */
  static fromSeed(seed: number, stream = 0): SamplerRng {
    if (!Number.isInteger(seed) || seed < 0 || seed > 0xffffffff) {
      throw new RangeError(`the seed must be an integer in [0, 4294967295], got ${seed}`);
    }
    if (!Number.isInteger(stream) || stream < 0 || stream > 0xffffffff) {
      throw new RangeError(`the stream index must be an integer in [0, 4294967295], got ${stream}`);
    }
    return new SamplerRng(zigguratFactory.factory({ seed: Uint32Array.of(seed >>> 0, stream >>> 0), copy: true }));
  }

  /** A generator restored from `state` (as returned by the `state` getter). */
  static fromState(state: Uint32Array): SamplerRng {
    return new SamplerRng(zigguratFactory.factory({ state: new Uint32Array(state), copy: true }));
  }

  /** The full generator state, a copy: save it to resume the stream exactly. */
  get state(): Uint32Array {
    return new Uint32Array(this.randn.state);
  }

  /** Uniform on [0, 1). */
  uniform(): number {
    return this.randu();
  }

  /** Standard normal. */
  normal(): number {
    return this.randn();
  }

  /** Uniform integer in [0, n): floor(n u), whose bias is below n / 2^53 (negligible for walker counts). */
  integer(n: number): number {
    return Math.floor(this.randu() * n);
  }
}
