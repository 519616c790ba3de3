// The one table of `npm run bench`: every target of the benchmark with its measured value, its
// baseline measured in the same run, the target and whether it is met.
//
// A row: { key, part, measurement, unit ('ms' | 's' | 'us' | 'fps' | 'MB'), value (null when the
// measurement failed or timed out: then `outcome` says which), baseline, baselineLabel,
// target: { on: 'value' | 'speedup' | 'growth', op: '<=' | '>=', limit } }. 'speedup' compares
// baseline / value with the limit, 'growth' value / baseline.

/** The number the target is about, or null when it cannot be computed. */
export function judged(row) {
  const { value, baseline } = row;
  if (value === null || !Number.isFinite(value)) return null;
  if (row.target.on === 'value') return value;
  if (baseline === null || !Number.isFinite(baseline) || baseline <= 0 || value <= 0) return null;
  return row.target.on === 'speedup' ? baseline / value : value / baseline;
}

/** Whether the row meets its target (a failed or unmeasurable row does not). */
export function isMet(row) {
  const x = judged(row);
  if (x === null) return false;
  return row.target.op === '<=' ? x <= row.target.limit : x >= row.target.limit;
}

function formatValue(value, unit) {
  if (value === null || value === undefined || !Number.isFinite(value)) return '-';
  if (unit === 'ms') {
    if (value >= 1000) return `${(value / 1000).toPrecision(3)} s`;
    return `${value >= 100 ? value.toFixed(0) : value.toPrecision(3)} ms`;
  }
  if (unit === 'us')
    return value >= 1000 ? `${(value / 1000).toPrecision(3)} ms` : `${value.toPrecision(3)} us`;
  if (unit === 'fps') return `${value.toFixed(1)} /s`;
  if (unit === 'MB') return `${value.toFixed(value >= 100 ? 0 : 1)} MB`;
  return `${value.toPrecision(3)} ${unit}`;
}

function targetText(row) {
  const { on, op, limit } = row.target;
  const sign = op === '<=' ? '<=' : '>=';
  if (on === 'value') return `${sign} ${formatValue(limit, row.unit)}`;
  if (on === 'speedup') return `baseline/measured ${sign} ${limit}x`;
  return `measured/baseline ${sign} ${limit}x`;
}

function verdict(row) {
  if (row.value === null) return `NOT MET (${row.outcome ?? 'failed'})`;
  const x = judged(row);
  const shown =
    row.target.on === 'value' || x === null
      ? ''
      : ` (${x >= 100 ? x.toFixed(0) : x.toPrecision(3)}x)`;
  return `${isMet(row) ? 'met' : 'NOT MET'}${shown}`;
}

/** The rows as one aligned plain-text table, grouped by part in the given order. */
export function formatTargetTable(rows) {
  const header = ['target', 'measured', 'baseline (same run)', 'target', 'verdict'];
  const cells = rows.map((row) => [
    `${row.part}: ${row.measurement}`,
    row.value === null ? (row.outcome ?? 'failed') : formatValue(row.value, row.unit),
    `${formatValue(row.baseline, row.unit)}${row.baselineLabel ? ` (${row.baselineLabel})` : ''}`,
    targetText(row),
    verdict(row),
  ]);
  const widths = header.map((h, k) => Math.max(h.length, ...cells.map((c) => c[k].length)));
  const line = (values) =>
    values
      .map((v, k) => (k === 1 ? v.padStart(widths[k]) : v.padEnd(widths[k])))
      .join('  ')
      .trimEnd();
  return [line(header), widths.map((w) => '-'.repeat(w)).join('  '), ...cells.map(line)].join('\n');
}

/** The rows as JSON, each with its verdict. */
export function targetRowsToJson(rows) {
  return rows.map((row) => ({ ...row, judged: judged(row), met: isMet(row) }));
}
