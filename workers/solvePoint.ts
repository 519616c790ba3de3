import { parseModel, solve, solveResultToJson } from '../solver/index';

/**
 * Solves one model given as parsed JSON and returns plain, structured-cloneable data.
 * Throws the parser's one-line Error (naming the bad field) on invalid input.
 */
export function solvePoint(modelJson: unknown) {
  return solveResultToJson(solve(parseModel(modelJson)));
}

/** The plain-data result of one solved point. */
export type SolveJson = ReturnType<typeof solvePoint>;
