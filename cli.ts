import { readFileSync, writeFileSync } from 'node:fs';
import { mapFigureSvg } from './app/figure/mapFigure';
import {
  ModelError,
  computePhaseMap,
  mapToCsv,
  mapToJson,
  parseMapInput,
  parseModel,
  solve,
  solveResultToJson,
} from './solver/index';
import { ThreadPool } from './workers/node/threadPool';

const USAGE = `usage:
  fourfold solve --model FILE            ground state of one model (or an array of models) as JSON
  fourfold map --model FILE --out OUT    Map of the model's plane; OUT ends in .json, .csv or .svg
options:
  --threads N   worker threads for map (default: all cores)
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
}

function parseArgs(argv: readonly string[]): Args {
  const [command, ...rest] = argv;
  if (command === undefined || command === '--help' || command === '-h') {
    throw new CliError(USAGE, 2);
  }
  if (command !== 'solve' && command !== 'map') {
    throw new CliError(`unknown command "${command}"; use solve or map (--help for usage)`, 2);
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
    } else if (flag === '--help') throw new CliError(USAGE, 2);
    else throw new CliError(`unknown option ${flag} (--help for usage)`, 2);
  }
  if (args.model === undefined) throw new CliError('--model: missing (give a model file)', 2);
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

async function runMap(json: unknown, out: string | undefined, threads?: number): Promise<void> {
  if (out === undefined)
    throw new CliError('--out: missing (give OUT.json, OUT.csv or OUT.svg)', 2);
  const format = /\.(json|csv|svg)$/i.exec(out)?.[1]?.toLowerCase();
  if (format === undefined)
    throw new CliError(`--out ${out}: unknown format; end it in .json, .csv or .svg`, 2);
  const input = parseMapInput(json);
  const pool = new ThreadPool(new URL('./mapThread.mjs', import.meta.url), threads);
  try {
    const map = await computePhaseMap(input, pool.stages, pool.size);
    const text =
      format === 'json'
        ? JSON.stringify(mapToJson(map))
        : format === 'csv'
          ? mapToCsv(map)
          : mapFigureSvg(map);
    try {
      writeFileSync(out, text);
    } catch (error) {
      throw new CliError(
        `--out ${out}: cannot write (${(error as NodeJS.ErrnoException).code ?? 'error'})`,
      );
    }
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
    else await runMap(json, args.out, args.threads);
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
