import type { ProbeReport } from '../../solver/index';

/**
 * The Probe as a JSON document: the report, and the plane point it was taken at when there is
 * one (the app's Save Probe and the CLI's `probe` write the same thing).
 */
export function probeDocument(report: ProbeReport, point?: { x: number; y: number }): string {
  return JSON.stringify(point ? { point, ...report } : report, null, 2) + '\n';
}
