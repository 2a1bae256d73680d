/**
 * XSadd (XORSHIFT-ADD), a small 32-bit pseudo-random generator by Saito and Matsumoto, used for
 * the reproducible draw of sampled serials. Written here from the published algorithm and checked
 * in tests against ml-xsadd (npm), an independent implementation. Not for secrets: the seed itself
 * comes from node:crypto; this only turns a recorded seed into the same sequence every time.
 */
const LOOP = 8;

/** 32-bit unsigned multiply without losing precision in doubles. */
function mulUint32(a: number, b: number): number {
  const aLow = a & 0xffff;
  const aHigh = a - aLow;
  return (((aHigh * b) >>> 0) + aLow * b) >>> 0;
}

export class XSadd {
  private readonly state = new Uint32Array(4);

  constructor(seed: number) {
    if (!Number.isInteger(seed) || seed < 0 || seed > 0xffffffff) throw new RangeError("The seed must be a whole number from 0 to 4294967295.");
    const s = this.state;
    s[0] = seed;
    for (let i = 1; i < LOOP; i++) {
      const previous = s[(i - 1) & 3];
      s[i & 3] ^= (i + mulUint32(1812433253, previous ^ (previous >>> 30))) >>> 0;
    }
    // An all-zero state would stay zero forever.
    if (s[0] === 0 && s[1] === 0 && s[2] === 0 && s[3] === 0) s.set([88, 83, 65, 68]);
    for (let i = 0; i < LOOP; i++) this.next();
  }

  private next() {
    const s = this.state;
    let t = s[0];
    t ^= t << 15;
    t ^= t >>> 18;
    t ^= s[3] << 11;
    s[0] = s[1];
    s[1] = s[2];
    s[2] = s[3];
    s[3] = t;
  }

  /** A uniformly distributed integer in [0, 2^32). */
  nextUint32(): number {
    this.next();
    return (this.state[3] + this.state[2]) >>> 0;
  }

  /** A uniformly distributed integer in [0, bound), without modulo bias (rejection sampling). */
  nextBelow(bound: number): number {
    if (!Number.isInteger(bound) || bound < 1 || bound > 0x100000000) throw new RangeError("bound must be a whole number from 1 to 2^32");
    const limit = Math.floor(0x100000000 / bound) * bound;
    for (;;) {
      const value = this.nextUint32();
      if (value < limit) return value % bound;
    }
  }
}
