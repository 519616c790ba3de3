import type { ProbeReport } from '../../solver/index';

/**
 * The Probe as a JSON document: the report, and the plane point it was taken at when there is
 * one (the app's Save Probe and the CLI's `probe` write the same thing). With several pins the
 * app adds their comparison (`comparisonDocument` in ./pinComparison.ts) under `comparison`.
 */
export function probeDocument(
  report: ProbeReport,
  point?: { x: number; y: number },
  comparison?: object,
): string {
  const document = point ? { point, ...report } : report;
  return (
    JSON.stringify(comparison === undefined ? document : { ...document, comparison }, null, 2) +
    '\n'
  );
}
