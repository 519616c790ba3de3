import type { Misses } from './points';

/** One line of the benchmark table; times in microseconds. */
export interface BenchRow {
  readonly key: string;
  readonly measurement: string;
  readonly oursMicroseconds: number;
  readonly baselineMicroseconds: number;
  /** How the baseline number was obtained when it is not a direct measurement. */
  readonly baselineNote?: string;
  readonly oursMisses?: Misses;
  readonly baselineMisses?: Misses;
  /** Upper bound on ours, microseconds. */
  readonly targetMicroseconds?: number;
}

export function formatDuration(micros: number): string {
  if (!Number.isFinite(micros)) return '-';
  if (micros < 1000) return `${micros.toPrecision(3)} us`;
  if (micros < 1e6) return `${(micros / 1000).toPrecision(3)} ms`;
  return `${(micros / 1e6).toPrecision(3)} s`;
}

export function formatMisses(misses: Misses | undefined): string {
  if (misses === undefined) return '-';
  return `${misses.count}/${misses.total}`;
}

function formatRatio(ratio: number): string {
  return ratio >= 100 ? `${Math.round(ratio)}x` : `${ratio.toPrecision(3)}x`;
}

function targetCell(row: BenchRow): string {
  if (row.targetMicroseconds === undefined) return '';
  const met = row.oursMicroseconds <= row.targetMicroseconds;
  return `<= ${formatDuration(row.targetMicroseconds)}: ${met ? 'met' : 'NOT MET'}`;
}

/** The rows as an aligned plain-text table. */
export function formatTable(rows: readonly BenchRow[]): string {
  const header = [
    'measurement',
    'ours',
    'naive',
    'naive/ours',
    'miss ours',
    'miss naive',
    'target',
  ];
  const cells = rows.map((row) => [
    row.measurement,
    formatDuration(row.oursMicroseconds),
    formatDuration(row.baselineMicroseconds) + (row.baselineNote ? ` (${row.baselineNote})` : ''),
    formatRatio(row.baselineMicroseconds / row.oursMicroseconds),
    formatMisses(row.oursMisses),
    formatMisses(row.baselineMisses),
    targetCell(row),
  ]);
  const widths = header.map((h, k) => Math.max(h.length, ...cells.map((line) => line[k]!.length)));
  const leftAligned = new Set([0, 6]);
  const line = (values: string[]) =>
    values
      .map((v, k) => (leftAligned.has(k) ? v.padEnd(widths[k]!) : v.padStart(widths[k]!)))
      .join('  ')
      .trimEnd();
  const rule = widths.map((w) => '-'.repeat(w)).join('  ');
  return [line(header), rule, ...cells.map(line)].join('\n');
}

/** The row as plain JSON numbers (ratio and target verdict included). */
export function rowToJson(row: BenchRow): Record<string, unknown> {
  return {
    ...row,
    ratio: row.baselineMicroseconds / row.oursMicroseconds,
    targetMet:
      row.targetMicroseconds === undefined
        ? undefined
        : row.oursMicroseconds <= row.targetMicroseconds,
  };
}
