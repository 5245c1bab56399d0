/**
 * A small seeded generator for the fuzz suite: mulberry32 (Tommy Ettinger's 32-bit generator, in
 * the public domain), so the same seed gives the same inputs on every run and machine.
 */
export class Random {
  private state: number;

  constructor(seed: number) {
    this.state = seed >>> 0;
  }

  /** A float in [0, 1). */
  next(): number {
    this.state = (this.state + 0x6d2b79f5) >>> 0;
    let t = this.state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  }

  /** A whole number in [lo, hi]. */
  int(lo: number, hi: number): number {
    return lo + Math.floor(this.next() * (hi - lo + 1));
  }

  chance(p: number): boolean {
    return this.next() < p;
  }

  pick<T>(items: readonly T[]): T {
    return items[Math.floor(this.next() * items.length)]!;
  }

  /** Text of `length` characters drawn from `alphabet`. */
  text(length: number, alphabet: string): string {
    let s = '';
    for (let i = 0; i < length; i++) s += alphabet[Math.floor(this.next() * alphabet.length)];
    return s;
  }
}
