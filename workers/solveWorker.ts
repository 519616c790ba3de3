import { expose } from 'comlink';
import { solvePoint } from './solvePoint';

/** What the solve worker exposes; the logic itself lives in solver/. */
const solveWorkerApi = { solvePoint };

export type SolveWorkerApi = typeof solveWorkerApi;

expose(solveWorkerApi);
