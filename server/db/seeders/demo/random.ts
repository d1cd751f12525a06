/** The demo's seeded randomness: one fixed seed, one named stream per concern. */
import { seededRandom, type SeededRandom } from "../../../../shared/random";

/** The demo's fixed seed; changing it changes every invented person, place and reading. */
const DEMO_SEED = 0x1a4b_3c2d;

/**
 * One stream per concern (`household-sites`, `feeding-digester-green` …), so changing how one
 * part is generated leaves the others as they were.
 */
export function demoRandom(stream: string): SeededRandom {
  return seededRandom(DEMO_SEED, stream);
}
