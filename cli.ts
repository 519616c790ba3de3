import { closeSync, openSync, readFileSync, writeSync } from 'node:fs';
import {
  MAX_CUT_POINTS,
  QUOTED_PATH_LENGTH,
  ModelError,
  computeCut,
  isPlainObject,
  cutToCsv,
  fitToJson,
  parseFitPlane,
  parseObservationsCsv,
  observationSetOfDocument,
  DEFAULT_FIT_OPTIONS,
  DEFAULT_SWEEP_FIELD,
  runFit as runObservationFit,
  cutToJson,
  errorLine,
  DEFAULT_WAVEVECTORS,
  MAX_WAVEVECTOR_COUNT,
  dispersionToCsv,
  dispersionToJson,
  modelAtPoint,
  modelDispersion,
  wavevectorGrid,
  parseMapInput,
  parseModel,
  probeModel,
  quoteInput,
  solve,
  solveResultToJson,
  textChunks,
} from './solver/index';
import { CliError } from './cli/cliError';
import { parseShard, runMapRows, shardPlace, type Shard, type StageRunner } from './cli/mapRun';
import { mapFileSink, partSink, type MapFormat } from './cli/mapSinks';
import { mergeParts, orderParts, readPartFile } from './cli/mergeParts';
import { runSeries } from './cli/seriesRun';

export { CliError };

// The figure and Probe writers (d3 among them) and the worker threads are loaded only by the
// commands that use them (dynamic imports: separate chunks of the bundle), so that `solve`
// starts without them.

const USAGE = `usage:
  fourfold solve --model FILE [--out OUT.json]
                                         ground state of one model (or an array of models) as
                                         JSON, on stdout or into OUT.json
  fourfold map --model FILE --out OUT [--threads N] [--column C] [--title TEXT]
                                         Map of the model's plane; OUT ends in .json, .csv or .svg
  fourfold map --model FILE --shard K/N --out PART.json [--threads N]
                                         piece K of N of the Map (rows of it), for merge
  fourfold merge --out OUT [--column C] [--title TEXT] PART.json ...
                                         the Map from all N pieces, in any order: the file map
                                         writes (OUT ends in .json, .csv or .svg)
  fourfold series --model FILE --vary Q --values V --out DIR|FIGURE.svg [--shard K/N]
                  [--threads N] [--column C] [--title TEXT]
                                         one Map per value of Q (zeeman, valleyZeeman, CH.fock,
                                         CH.hartree or ratio:CH, CH a channel such as x0; V as
                                         v1,v2,... or from:to:n): each Map's JSON and a figure
                                         of small multiples; a rerun keeps finished files;
                                         with --shard, piece K of N of every Map
  fourfold cut --model FILE --from x,y --to x,y [--n N] --out OUT [--column C] [--title TEXT]
                                         Cut along a straight line of the model's plane (plane
                                         coordinates); N samples (default 200); OUT as for map
  fourfold probe --model FILE [--at x,y] [--out LATTICE.svg]
                                         Probe of one model (or an array): spinors, entanglement,
                                         sublattice spins, bond order, levels, modes and their
                                         symmetries, competitors, as JSON on stdout; --at takes
                                         the point x,y of the model's plane; --out writes the
                                         lattice picture of one model as SVG (the JSON still
                                         goes to stdout)
  fourfold modes --model FILE [--coulomb C] [--q FROM:TO:N] [--gate D] [--out OUT]
                                         collective modes at finite wavevector q (1/l_B) of the
                                         model's ground state; C = e^2/(eps l_B) in the model's
                                         unit (default: the model's "coulomb"); q from FROM to
                                         TO in N points (default 0:6:61); D a gate distance in
                                         l_B; OUT ends in .json, .csv or .svg (default: JSON on
                                         stdout)
  fourfold fit --model PLANE.json --observations OBS.csv [--out FIT.json] [--threads N]
                                         which couplings of the plane (meV per tesla of B_perp)
                                         explain a sample's observations: the consistency grid,
                                         the maximum-likelihood estimate with uncertainties and
                                         each row's prediction, as JSON on stdout or in FIT.json
options:
  --threads N   worker threads for map, series and fit (default: all cores)
  --shard K/N   piece K of N (K from 1) of a Map: its rows, written as a part for merge
  --observations OBS.csv
                the fit's observations: header bPerp_T,tilt_deg,valleyZeeman_meV,kind,value,sigma
  --column single|double
                figure width of a map's, a cut's or the modes' .svg: one journal column (8.6 cm,
                default) or two (17.8 cm)
  --title TEXT  a title above a map's, a cut's or the modes' .svg figure (E_Z, u_perp, Delta_V
                are typeset)
  --help        this text
Each option is given at most once. An option the command does not take (--threads for cut,
--title for a .json or .csv output, ...) is refused, as is a repeated one: one line on stderr,
exit code 2.`;

interface Args {
  command: Command;
  model?: string;
  out?: string;
  threads?: number;
  column?: 'single' | 'double';
  title?: string;
  from?: [number, number];
  to?: [number, number];
  n?: number;
  at?: [number, number];
  coulomb?: number;
  gate?: number;
  q?: { from: number; to: number; count: number };
  observations?: string;
  shard?: Shard;
  vary?: string;
  values?: string;
  /** merge: the part files. */
  parts: string[];
}

type Command = 'solve' | 'map' | 'merge' | 'series' | 'cut' | 'probe' | 'modes' | 'fit';

/** The options each command takes; any other is refused, so that none is silently ignored. */
const COMMAND_OPTIONS: Readonly<Record<Command, readonly string[]>> = {
  solve: ['--model', '--out'],
  map: ['--model', '--out', '--threads', '--column', '--title', '--shard'],
  merge: ['--out', '--column', '--title'],
  series: ['--model', '--vary', '--values', '--out', '--shard', '--threads', '--column', '--title'],
  cut: ['--model', '--from', '--to', '--n', '--out', '--column', '--title'],
  probe: ['--model', '--at', '--out'],
  modes: ['--model', '--coulomb', '--q', '--gate', '--out', '--column', '--title'],
  fit: ['--model', '--observations', '--out', '--threads'],
};

const ALL_OPTIONS = new Set(Object.values(COMMAND_OPTIONS).flat());

/** A plane point typed as `x,y` (two finite numbers). */
function parsePoint(flag: string, text: string): [number, number] {
  const parts = text.split(',');
  const numbers = parts.map((p) => (p.trim() === '' ? NaN : Number(p)));
  if (numbers.length !== 2 || !numbers.every(Number.isFinite)) {
    throw new CliError(
      `${flag}: expected a plane point x,y (two finite numbers), got ${quoteInput(text)}`,
      2,
    );
  }
  return [numbers[0]!, numbers[1]!];
}

/** A non-negative (or, `positive`, strictly positive) finite number given to `flag`. */
function parseAmount(flag: string, text: string, what: string, positive = false): number {
  const value = text.trim() === '' ? NaN : Number(text);
  if (!Number.isFinite(value) || value < 0 || (positive && value === 0)) {
    throw new CliError(`${flag}: expected ${what}, got ${quoteInput(text)}`, 2);
  }
  return value;
}

/** `--q FROM:TO:N`: N wavevectors from FROM to TO (1/l_B). */
function parseWavevectors(text: string): { from: number; to: number; count: number } {
  const parts = text.split(':').map((p) => (p.trim() === '' ? NaN : Number(p)));
  const [from, to, count] = parts;
  if (
    parts.length !== 3 ||
    !Number.isFinite(from) ||
    !Number.isFinite(to) ||
    !Number.isInteger(count) ||
    from! < 0 ||
    to! <= from! ||
    count! < 2 ||
    count! > MAX_WAVEVECTOR_COUNT
  ) {
    throw new CliError(
      `--q: expected FROM:TO:N with 0 <= FROM < TO (1/l_B) and N from 2 to ${MAX_WAVEVECTOR_COUNT}, got ${quoteInput(text)}`,
      2,
    );
  }
  return { from: from!, to: to!, count: count! };
}

function isCommand(command: string): command is Command {
  return Object.hasOwn(COMMAND_OPTIONS, command);
}

function parseArgs(argv: readonly string[]): Args {
  const [command, ...rest] = argv;
  if (command === undefined || command === '--help' || command === '-h') {
    throw new CliError(USAGE, 2);
  }
  if (!isCommand(command)) {
    throw new CliError(
      `unknown command ${quoteInput(command)}; use solve, map, merge, series, cut, probe, modes or fit`,
      2,
    );
  }
  if (rest.includes('--help')) throw new CliError(USAGE, 2);
  const args: Args = { command, parts: [] };
  const seen = new Set<string>();
  for (let k = 0; k < rest.length; k++) {
    const flag = rest[k]!;
    if (!flag.startsWith('--')) {
      if (command === 'merge') {
        args.parts.push(flag);
        continue;
      }
      throw new CliError(`unexpected argument ${quoteInput(flag)} (--help for usage)`, 2);
    }
    if (!ALL_OPTIONS.has(flag)) {
      throw new CliError(`unknown option ${quoteInput(flag)} (--help for usage)`, 2);
    }
    if (!COMMAND_OPTIONS[command].includes(flag)) {
      const takers = Object.keys(COMMAND_OPTIONS).filter((c) =>
        COMMAND_OPTIONS[c as Command].includes(flag),
      );
      throw new CliError(
        `${flag}: ${command} does not take it (${takers.join(' and ')} ${takers.length > 1 ? 'do' : 'does'}; ${command} takes ${COMMAND_OPTIONS[command].join(', ')})`,
        2,
      );
    }
    if (seen.has(flag)) throw new CliError(`${flag}: given twice; give each option once`, 2);
    seen.add(flag);
    const value = rest[k + 1];
    if (value === undefined || value.startsWith('--')) {
      throw new CliError(`${flag}: missing value`, 2);
    }
    k++;
    if (flag === '--model') args.model = value;
    else if (flag === '--out') args.out = value;
    else if (flag === '--threads') {
      const n = value.trim() === '' ? NaN : Number(value);
      if (!Number.isInteger(n) || n < 1 || n > 256) {
        throw new CliError(
          `--threads: expected an integer from 1 to 256, got ${quoteInput(value)}`,
          2,
        );
      }
      args.threads = n;
    } else if (flag === '--column') {
      if (value !== 'single' && value !== 'double') {
        throw new CliError(`--column: expected single or double, got ${quoteInput(value)}`, 2);
      }
      args.column = value;
    } else if (flag === '--title') args.title = value;
    else if (flag === '--from') args.from = parsePoint(flag, value);
    else if (flag === '--to') args.to = parsePoint(flag, value);
    else if (flag === '--at') args.at = parsePoint(flag, value);
    else if (flag === '--coulomb') {
      args.coulomb = parseAmount(flag, value, "e^2/(eps l_B) >= 0 in the model's unit");
    } else if (flag === '--gate') {
      args.gate = parseAmount(flag, value, 'a gate distance > 0 in units of l_B', true);
    } else if (flag === '--q') args.q = parseWavevectors(value);
    else if (flag === '--observations') args.observations = value;
    else if (flag === '--n') {
      const n = value.trim() === '' ? NaN : Number(value);
      if (!Number.isInteger(n) || n < 2 || n > MAX_CUT_POINTS) {
        throw new CliError(
          `--n: expected an integer from 2 to ${MAX_CUT_POINTS} (samples along the cut), got ${quoteInput(value)}`,
          2,
        );
      }
      args.n = n;
    } else if (flag === '--shard') args.shard = parseShard(value, (t) => quoteInput(t));
    else if (flag === '--vary') args.vary = value;
    else if (flag === '--values') args.values = value;
  }
  if (command === 'merge') {
    if (args.parts.length === 0) {
      throw new CliError('merge: no parts given (list the part files after the options)', 2);
    }
  } else if (args.model === undefined) {
    throw new CliError('--model: missing (give a model file)', 2);
  }
  if (command === 'series') {
    if (args.vary === undefined) {
      throw new CliError(
        '--vary: missing (zeeman, valleyZeeman, CH.fock, CH.hartree or ratio:CH)',
        2,
      );
    }
    if (args.values === undefined) {
      throw new CliError('--values: missing (v1,v2,... or from:to:n)', 2);
    }
    if (args.out === undefined)
      throw new CliError('--out: missing (give a folder or FIGURE.svg)', 2);
    // A file name of another kind is a slip, not a folder to fill with Maps.
    if (/\.(json|csv|txt|png|pdf|eps|jpe?g)$/i.test(args.out)) {
      throw new CliError(
        `--out ${quoteInput(args.out, QUOTED_PATH_LENGTH)}: series writes a folder of Maps or a figure; give a folder or end it in .svg`,
        2,
      );
    }
  }
  if (command === 'cut') {
    if (args.from === undefined) throw new CliError('--from: missing (give the start as x,y)', 2);
    if (args.to === undefined) throw new CliError('--to: missing (give the end as x,y)', 2);
    if (args.from[0] === args.to[0] && args.from[1] === args.to[1]) {
      throw new CliError('--to: must differ from --from (a cut needs two distinct end points)', 2);
    }
  }
  if (command === 'fit' && args.observations === undefined) {
    throw new CliError('--observations: missing (give the observations as OBS.csv)', 2);
  }
  if (command === 'fit' && args.out !== undefined && !/\.json$/i.test(args.out)) {
    throw new CliError(
      `--out ${quoteInput(args.out, QUOTED_PATH_LENGTH)}: fit writes its result as JSON; end it in .json`,
      2,
    );
  }
  if (args.out !== undefined) {
    const ending = command === 'solve' ? 'json' : command === 'probe' ? 'svg' : null;
    if (ending !== null && !args.out.toLowerCase().endsWith(`.${ending}`)) {
      throw new CliError(
        command === 'solve'
          ? `--out ${quoteInput(args.out, QUOTED_PATH_LENGTH)}: solve writes its result as JSON; end it in .json`
          : `--out ${quoteInput(args.out, QUOTED_PATH_LENGTH)}: the probe writes its lattice picture; end it in .svg`,
        2,
      );
    }
  }
  if (command === 'modes' && args.out !== undefined) outputFormat(args.out);
  if (command === 'map' || command === 'cut' || command === 'merge' || command === 'modes') {
    const data = args.out === undefined ? command === 'modes' : !/\.svg$/i.test(args.out);
    for (const flag of ['--column', '--title'] as const) {
      if (seen.has(flag) && data) {
        throw new CliError(`${flag}: only for a figure; it applies when --out ends in .svg`, 2);
      }
    }
  }
  if (args.shard !== undefined) {
    for (const flag of ['--column', '--title'] as const) {
      if (seen.has(flag)) {
        throw new CliError(
          `${flag}: only for a figure, and --shard writes parts (merge draws the figure)`,
          2,
        );
      }
    }
    if (command === 'map' && args.out !== undefined && !/\.json$/i.test(args.out)) {
      throw new CliError(
        `--out ${quoteInput(args.out, QUOTED_PATH_LENGTH)}: --shard writes a part as JSON; end it in .json`,
        2,
      );
    }
  }
  return args;
}

/** The text of a file the command reads (the model, the observations); one line naming it if it cannot. */
function readText(flag: string, path: string): string {
  try {
    return readFileSync(path, 'utf8');
  } catch (error) {
    const code = (error as NodeJS.ErrnoException).code;
    const reason =
      code === 'ENOENT'
        ? 'no such file'
        : code === 'EISDIR'
          ? 'is a directory'
          : (code ?? 'unreadable');
    throw new CliError(`${flag} ${quoteInput(path, QUOTED_PATH_LENGTH)}: ${reason}`);
  }
}

function readJson(path: string): unknown {
  let text = readText('--model', path);
  // A UTF-8 byte order mark is not JSON (RFC 8259 section 8.1), but some editors write one.
  if (text.startsWith('\ufeff')) text = text.slice(1);
  try {
    return JSON.parse(text) as unknown;
  } catch (error) {
    throw new CliError(
      `--model ${quoteInput(path, QUOTED_PATH_LENGTH)}: not valid JSON (${errorLine(error)})`,
    );
  }
}

/** The `solve` result as JSON text (one result, or an array of them). */
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
async function runProbe(json: unknown, args: Args): Promise<string> {
  const [{ latticeSvg }, { probeDocument }] = await Promise.all([
    import('./app/probe/latticeSvg'),
    import('./app/probe/probeDocument'),
  ]);
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
function outputFormat(out: string | undefined): { path: string; format: MapFormat } {
  if (out === undefined)
    throw new CliError('--out: missing (give OUT.json, OUT.csv or OUT.svg)', 2);
  const format = /\.(json|csv|svg)$/i.exec(out)?.[1]?.toLowerCase();
  if (format === undefined)
    throw new CliError(
      `--out ${quoteInput(out, QUOTED_PATH_LENGTH)}: unknown format; end it in .json, .csv or .svg`,
      2,
    );
  return { path: out, format: format as 'json' | 'csv' | 'svg' };
}

/**
 * Writes `content` to the file `out`: one string, or pieces (a large Map's JSON or CSV) that go
 * to the file a chunk at a time, so the whole text is never held in memory.
 */
function writeOutput(out: string, content: string | Iterable<string>): void {
  let fd: number | undefined;
  try {
    fd = openSync(out, 'w');
    for (const chunk of typeof content === 'string' ? [content] : textChunks(content)) {
      const bytes = Buffer.from(chunk, 'utf8');
      for (let done = 0; done < bytes.length;) done += writeSync(fd, bytes, done);
    }
  } catch (error) {
    const code = (error as NodeJS.ErrnoException).code;
    if (code === undefined) throw error;
    throw new CliError(`--out ${quoteInput(out, QUOTED_PATH_LENGTH)}: cannot write (${code})`);
  } finally {
    if (fd !== undefined) closeSync(fd);
  }
}

/** A Cut along the straight line from `from` to `to` in the model's plane (one thread). */
async function runCut(json: unknown, args: Args): Promise<void> {
  const { path, format } = outputFormat(args.out);
  const { cutFigureSvg } = await import('./app/figure/cutFigure');
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

/** The worker threads of a Map run (loaded only by the commands that compute Maps). */
async function threadRunner(
  threads: number | undefined,
): Promise<StageRunner & { close(): Promise<void> }> {
  const { ThreadPool } = await import('./workers/node/threadPool');
  const pool = new ThreadPool(new URL('./mapThread.mjs', import.meta.url), threads);
  return { stages: pool.stages, size: pool.size, close: () => pool.close() };
}

/** The Map's figure function, loaded with d3 only when a figure is written. */
async function figureDrawer() {
  const { mapFigureSvg } = await import('./app/figure/mapFigure');
  return mapFigureSvg;
}

/**
 * `map`: the whole Map into one file, streamed band by band (JSON through a spill file beside
 * it, CSV a row at a time, SVG from the labels), or with `--shard K/N` piece K of N as a part.
 */
async function runMap(json: unknown, args: Args): Promise<void> {
  const input = parseMapInput(json);
  if (args.shard !== undefined) {
    if (args.out === undefined) throw new CliError('--out: missing (give PART.json)', 2);
    const place = shardPlace(input, args.shard);
    const runner = await threadRunner(args.threads);
    try {
      const sink = partSink(input, args.out, { shard: args.shard, rows: place.rows });
      await runMapRows(input, runner, sink, place.cellRows);
    } finally {
      await runner.close();
    }
    return;
  }
  const { path, format } = outputFormat(args.out);
  const drawFigure = format === 'svg' ? await figureDrawer() : undefined;
  const runner = await threadRunner(args.threads);
  try {
    const sink = mapFileSink(input, path, {
      format,
      figure: { column: args.column, title: args.title },
      drawFigure,
    });
    await runMapRows(input, runner, sink);
  } finally {
    await runner.close();
  }
}

/** `merge`: the whole Map's file from all its parts. */
async function runMerge(args: Args): Promise<void> {
  const { path, format } = outputFormat(args.out);
  const parts = orderParts(args.parts.map(readPartFile));
  const { input, series } = parts[0]!.header;
  const drawFigure = format === 'svg' ? await figureDrawer() : undefined;
  const sink = mapFileSink(input, path, {
    format,
    figure: { column: args.column, title: args.title },
    drawFigure,
    provenance: { series },
  });
  mergeParts(parts, sink);
}

/**
 * The collective modes of one model's ground state along q (README, Command line): JSON on
 * stdout, or the file `--out` names (.json, .csv or .svg, the figure of the app's Probe).
 */
async function runModes(json: unknown, args: Args): Promise<void> {
  if (Array.isArray(json)) {
    throw new ModelError('model file: modes takes one model, not an array');
  }
  const model = parseModel(json);
  const grid = args.q ?? DEFAULT_WAVEVECTORS;
  const q = wavevectorGrid(grid.from, grid.to, grid.count);
  if (args.coulomb === undefined && model.coulomb === undefined) {
    throw new CliError(
      'coulomb: the model sets no Coulomb scale; add "coulomb": e^2/(eps l_B) in its unit, or give --coulomb C',
    );
  }
  const { dispersion, phase } = modelDispersion(model, q, {
    ...(args.coulomb !== undefined ? { coulomb: args.coulomb } : {}),
    ...(args.gate !== undefined ? { gateDistance: args.gate } : {}),
  });
  const context = { model, phase };
  if (args.out === undefined) {
    process.stdout.write(`${JSON.stringify(dispersionToJson(dispersion, context))}\n`);
    return;
  }
  const { path, format } = outputFormat(args.out);
  let text: string;
  if (format === 'json') text = `${JSON.stringify(dispersionToJson(dispersion, context))}\n`;
  else if (format === 'csv') text = dispersionToCsv(dispersion, context);
  else {
    const { dispersionFigureSvg } = await import('./app/probe/dispersionFigure');
    text = dispersionFigureSvg(dispersion, context, { column: args.column, title: args.title });
  }
  writeOutput(path, text);
}

/**
 * Which couplings of the plane explain the observations (README, Command line): the
 * consistency grid, the fit and each row's prediction, as JSON. A bad row ends with one line
 * naming its row and column (exit 1).
 */
async function runFit(json: unknown, args: Args): Promise<void> {
  const source = args.observations!;
  const text = readText('--observations', source);
  let rows;
  try {
    rows = parseObservationsCsv(text);
  } catch (error) {
    if (error instanceof ModelError) {
      throw new CliError(
        `--observations ${quoteInput(source, QUOTED_PATH_LENGTH)}: ${error.message}`,
      );
    }
    throw error;
  }
  if (rows.length === 0) {
    throw new CliError(
      `--observations ${quoteInput(source, QUOTED_PATH_LENGTH)}: no observation rows below the header`,
    );
  }
  const plane = parseFitPlane(json);
  const { ThreadPool } = await import('./workers/node/threadPool');
  const pool = new ThreadPool(new URL('./mapThread.mjs', import.meta.url), args.threads);
  try {
    // Options a scenario saved by the app carries (its own rows give way to OBS.csv).
    const options = observationSetOfDocument(json, '--model')?.options ?? DEFAULT_FIT_OPTIONS;
    const problem = { plane, rows, options };
    const outcome = await runObservationFit(problem, pool.fitRunners, DEFAULT_SWEEP_FIELD);
    const document = `${JSON.stringify(fitToJson(problem, outcome))}\n`;
    if (args.out === undefined) process.stdout.write(document);
    else writeOutput(args.out, document);
  } finally {
    await pool.close();
  }
}

/** Runs the CLI; returns the exit code. Every failure is one line on stderr, no stack trace. */
export async function main(argv: readonly string[]): Promise<number> {
  try {
    const args = parseArgs(argv);
    if (args.command === 'merge') {
      await runMerge(args);
      return 0;
    }
    const json = readJson(args.model!);
    if (args.command === 'solve') {
      const text = runSolve(json) + '\n';
      if (args.out === undefined) process.stdout.write(text);
      else writeOutput(args.out, text);
    } else if (args.command === 'cut') await runCut(json, args);
    else if (args.command === 'probe') process.stdout.write(await runProbe(json, args));
    else if (args.command === 'modes') await runModes(json, args);
    else if (args.command === 'fit') await runFit(json, args);
    else if (args.command === 'series') {
      const runner = () => threadRunner(args.threads);
      await runSeries(json, {
        vary: args.vary!,
        values: args.values!,
        out: args.out!,
        shard: args.shard,
        column: args.column,
        title: args.title,
        runner,
        figureDrawer,
      });
    } else await runMap(json, args);
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
