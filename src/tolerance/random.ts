/**
 * Reproducible, splittable random streams for Monte Carlo trials.
 *
 * The trials are cut into blocks of a fixed size; block b draws from its own xoroshiro128+ generator
 * (pure-rand), the seed's generator advanced by b jumps of 2^64 steps each (D. Blackman, S. Vigna,
 * "Scrambled linear pseudorandom number generators", ACM TOMS 47(4), 2021: the jump polynomial).
 * The streams of different blocks therefore never overlap for any realistic run (a block would need
 * 2^64 draws), and block b's values depend only on (seed, b): a worker that runs blocks 40..79 draws
 * exactly what the serial run draws for them. Results of blocks are combined in block order.
 */
import { xoroshiro128plus } from 'pure-rand/generator/xoroshiro128plus';
import type { JumpableRandomGenerator } from 'pure-rand/types/JumpableRandomGenerator';

/** Trials per block: large enough that the jump (a few hundred word operations) is negligible, small enough to balance two to eight workers on 10^5 trials. */
export const DEFAULT_BLOCK_SIZE = 1024;

/** Hands out block generators; asking in increasing block order costs one jump per block. */
export class BlockStreams {
  private last: JumpableRandomGenerator;
  private lastBlock = 0;

  constructor(readonly seed: number) {
    this.last = xoroshiro128plus(seed | 0);
  }

  /** A fresh generator for block `block` (the caller may consume it freely). */
  generatorFor(block: number): JumpableRandomGenerator {
    if (block < this.lastBlock) {
      this.last = xoroshiro128plus(this.seed | 0);
      this.lastBlock = 0;
    }
    while (this.lastBlock < block) {
      this.last.jump();
      this.lastBlock++;
    }
    return this.last.clone();
  }
}
