import { occupiedCount, type Filling } from '../../solver/index';

const WORDS = ['no', 'one', 'two', 'three', 'four'];

/**
 * How many electrons per flux quantum the n = 0 level holds at filling nu, as a sentence:
 * "one electron" at nu = -1, "two electrons" at nu = 0, "three electrons" at nu = +1 (Nf = nu + 2
 * of its four spin-valley states filled; public/notes.html#setting).
 */
export function electronsPerFluxQuantum(filling: Filling): string {
  const count = occupiedCount({ filling });
  return `${WORDS[count]} electron${count === 1 ? '' : 's'} per flux quantum`;
}
