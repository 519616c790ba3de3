import { readFileSync, writeFileSync } from 'node:fs';
import { cutFigureSvg } from './app/figure/cutFigure';
import { mapFigureSvg } from './app/figure/mapFigure';
import { latticeSvg } from './app/probe/latticeSvg';
import { probeDocument } from './app/probe/probeDocument';
import {
  MAX_CUT_POINTS,
  ModelError,
  computeCut,
  computePhaseMap,
  isPlainObject,
  cutToCsv,
  cutToJson,
  mapToCsv,
  mapToJson,
  modelAtPoint,
  parseMapInput,
  parseModel,
  probeModel,
  solve,
  solveResultToJson,
} from './solver/index';
import { ThreadPool } from './workers/node/threadPool';

const USAGE = `usage:
  fourfold solve --model FILE            ground state of one model (or an array of models) as JSON
  fourfold map --model FILE --out OUT    Map of the model's plane; OUT ends in .json, .csv or .svg
  fourfold cut --model FILE --from x,y --to x,y [--n N] --out OUT
                                         Cut along a straight line of the model's plane (plane
                                         coordinates); N samples (default 200); OUT as for map
  fourfold probe --model FILE [--at x,y] [--out LATTICE.svg]
                                         Probe of one model (or an array): spinors, entanglement,
                                         sublattice spins, bond order, levels, modes and their
                                         symmetries, competitors, as JSON; --at takes the point
                                         x,y of the model's plane; --out writes the lattice
                                         picture of one model as SVG
options:
  --threads N   worker threads for map (default: all cores)
  --column single|double
                figure width of a map's or a cut's .svg: one journal column (8.6 cm,
                default) or two (17.8 cm)
  --title TEXT  a title above a map's or a cut's .svg figure (E_Z, u_perp, Delta_V are typeset)
  --help        this text`;

/** A failure to report in one line, with the process exit code. */
export class CliError extends Error {
  constructor(
    message: string,
    readonly exitCode = 1,
  ) {
    super(message);
  }
}

interface Args {
  command: string;
  model?: string;
  out?: string;
  threads?: number;
  column?: 'single' | 'double';
  title?: string;
  from?: [number, number];
  to?: [number, number];
  n?: number;
  at?: [number, number];
}

/** A plane point typed as `x,y` (two finite numbers). */
function parsePoint(flag: string, text: string): [number, number] {
  const parts = text.split(',');
  const numbers = parts.map((p) => (p.trim() === '' ? NaN : Number(p)));
  if (numbers.length !== 2 || !numbers.every(Number.isFinite)) {
    throw new CliError(
      `${flag}: expected a plane point x,y (two finite numbers), got "${text}"`,
      2,
    );
  }
  return [numbers[0]!, numbers[1]!];
}

function parseArgs(argv: readonly string[]): Args {
  const [command, ...rest] = argv;
  if (command === undefined || command === '--help' || command === '-h') {
    throw new CliError(USAGE, 2);
  }
  if (command !== 'solve' && command !== 'map' && command !== 'cut' && command !== 'probe') {
    throw new CliError(
      `unknown command "${command}"; use solve, map, cut or probe (--help for usage)`,
      2,
    );
  }
  const args: Args = { command };
  for (let k = 0; k < rest.length; k++) {
    const flag = rest[k]!;
    const value = rest[k + 1];
    const need = (): string => {
      if (value === undefined || value.startsWith('--'))
        throw new CliError(`${flag}: missing value`, 2);
      k++;
      return value;
    };
    if (flag === '--model') args.model = need();
    else if (flag === '--out') args.out = need();
    else if (flag === '--threads') {
      const n = Number(need());
      if (!Number.isInteger(n) || n < 1 || n > 256) {
        throw new CliError(`--threads: expected an integer from 1 to 256, got ${value}`, 2);
      }
      args.threads = n;
    } else if (flag === '--column') {
      const column = need();
      if (column !== 'single' && column !== 'double') {
        throw new CliError(`--column: expected single or double, got "${column}"`, 2);
      }
      args.column = column;
    } else if (flag === '--title') args.title = need();
    else if (flag === '--from') args.from = parsePoint(flag, need());
    else if (flag === '--to') args.to = parsePoint(flag, need());
    else if (flag === '--at') args.at = parsePoint(flag, need());
    else if (flag === '--n') {
      const text = need();
      const n = text.trim() === '' ? NaN : Number(text);
      if (!Number.isInteger(n) || n < 2 || n > MAX_CUT_POINTS) {
        throw new CliError(
          `--n: expected an integer from 2 to ${MAX_CUT_POINTS} (samples along the cut), got ${text}`,
          2,
        );
      }
      args.n = n;
    } else if (flag === '--help') throw new CliError(USAGE, 2);
    else throw new CliError(`unknown option ${flag} (--help for usage)`, 2);
  }
  if (args.model === undefined) throw new CliError('--model: missing (give a model file)', 2);
  if (command === 'cut') {
    if (args.from === undefined) throw new CliError('--from: missing (give the start as x,y)', 2);
    if (args.to === undefined) throw new CliError('--to: missing (give the end as x,y)', 2);
    if (args.from[0] === args.to[0] && args.from[1] === args.to[1]) {
      throw new CliError('--to: must differ from --from (a cut needs two distinct end points)', 2);
    }
  } else {
    for (const flag of ['from', 'to', 'n'] as const) {
      if (args[flag] !== undefined) throw new CliError(`--${flag}: only for the cut command`, 2);
    }
  }
  if (command !== 'probe' && args.at !== undefined) {
    throw new CliError('--at: only for the probe command', 2);
  }
  if (command === 'probe' && args.out !== undefined && !/\.svg$/i.test(args.out)) {
    throw new CliError(
      `--out ${args.out}: the probe writes its lattice picture; end it in .svg`,
      2,
    );
  }
  return args;
}

function readJson(path: string): unknown {
  let text: string;
  try {
    text = readFileSync(path, 'utf8');
  } catch (error) {
    const code = (error as NodeJS.ErrnoException).code;
    const reason =
      code === 'ENOENT'
        ? 'no such file'
        : code === 'EISDIR'
          ? 'is a directory'
          : (code ?? 'unreadable');
    throw new CliError(`--model ${path}: ${reason}`);
  }
  try {
    return JSON.parse(text) as unknown;
  } catch (error) {
    throw new CliError(
      `--model ${path}: not valid JSON (${(error as Error).message.split('\n')[0]})`,
    );
  }
}

function runSolve(json: unknown): string {
  if (Array.isArray(json)) {
    if (json.length === 0)
      throw new ModelError('model file: empty array (give at least one model)');
    const results = json.map((m, k) => solveResultToJson(solve(parseModel(m, `[${k}]`))));
    return JSON.stringify(results, null, 2);
  }
  return JSON.stringify(solveResultToJson(solve(parseModel(json))), null, 2);
}

/**
 * The Probe of one model (or of each model of an array), or of the plane point `--at`; with
 * `--out`, the lattice picture of the (single) Probe as SVG. The JSON goes to stdout.
 */
function runProbe(json: unknown, args: Args): string {
  if (args.at !== undefined) {
    const [x, y] = args.at;
    if (!isPlainObject(json) || json.plane === undefined) {
      throw new CliError(
        '--at: the model file has no plane to take the point in (add one, or drop --at)',
        2,
      );
    }
    const report = probeModel(modelAtPoint(parseMapInput(json), x, y));
    if (args.out !== undefined) writeOutput(args.out, latticeSvg(report));
    return probeDocument(report, { x, y });
  }
  if (Array.isArray(json)) {
    if (json.length === 0)
      throw new ModelError('model file: empty array (give at least one model)');
    if (args.out !== undefined) {
      throw new CliError('--out: a lattice picture needs one model, not an array', 2);
    }
    const reports = json.map((m, k) => probeModel(parseModel(m, `[${k}]`)));
    return JSON.stringify(reports, null, 2) + '\n';
  }
  const report = probeModel(parseModel(json));
  if (args.out !== undefined) writeOutput(args.out, latticeSvg(report));
  return probeDocument(report);
}

/** The output file and the format its ending names. */
function outputFormat(out: string | undefined): { path: string; format: 'json' | 'csv' | 'svg' } {
  if (out === undefined)
    throw new CliError('--out: missing (give OUT.json, OUT.csv or OUT.svg)', 2);
  const format = /\.(json|csv|svg)$/i.exec(out)?.[1]?.toLowerCase();
  if (format === undefined)
    throw new CliError(`--out ${out}: unknown format; end it in .json, .csv or .svg`, 2);
  return { path: out, format: format as 'json' | 'csv' | 'svg' };
}

function writeOutput(out: string, text: string): void {
  try {
    writeFileSync(out, text);
  } catch (error) {
    throw new CliError(
      `--out ${out}: cannot write (${(error as NodeJS.ErrnoException).code ?? 'error'})`,
    );
  }
}

/** A Cut along the straight line from `from` to `to` in the model's plane (one thread). */
function runCut(json: unknown, args: Args): void {
  const { path, format } = outputFormat(args.out);
  const input = parseMapInput(json);
  const cut = computeCut(input, { kind: 'line', from: args.from!, to: args.to! }, args.n ?? 200);
  const text =
    format === 'json'
      ? JSON.stringify(cutToJson(cut, input))
      : format === 'csv'
        ? cutToCsv(cut, input)
        : cutFigureSvg(cut, { plane: input.plane, column: args.column, title: args.title });
  writeOutput(path, text);
}

async function runMap(json: unknown, args: Args): Promise<void> {
  const { path, format } = outputFormat(args.out);
  const input = parseMapInput(json);
  const pool = new ThreadPool(new URL('./mapThread.mjs', import.meta.url), args.threads);
  try {
    const map = await computePhaseMap(input, pool.stages, pool.size);
    const text =
      format === 'json'
        ? JSON.stringify(mapToJson(map))
        : format === 'csv'
          ? mapToCsv(map)
          : mapFigureSvg(map, { column: args.column, title: args.title });
    writeOutput(path, text);
  } finally {
    await pool.close();
  }
}

/** Runs the CLI; returns the exit code. Every failure is one line on stderr, no stack trace. */
export async function main(argv: readonly string[]): Promise<number> {
  try {
    const args = parseArgs(argv);
    const json = readJson(args.model!);
    if (args.command === 'solve') process.stdout.write(runSolve(json) + '\n');
    else if (args.command === 'cut') runCut(json, args);
    else if (args.command === 'probe') process.stdout.write(runProbe(json, args));
    else await runMap(json, args);
    return 0;
  } catch (error) {
    if (error instanceof CliError && error.exitCode === 2 && error.message === USAGE) {
      process.stderr.write(USAGE + '\n');
      return 2;
    }
    const message = error instanceof Error ? error.message : String(error);
    process.stderr.write(`fourfold: ${message.split('\n')[0]}\n`);
    return error instanceof CliError ? error.exitCode : 1;
  }
}
