import { CHANNELS } from './channels';
import { modelToJson } from './model';
import { TOKEN_MEANINGS } from './phaseLabel';
import type { PhaseMap } from './mapGrid';
import { MEAN_FIELD_CAUTION, SOFTWARE_VERSION } from './version';

function rows(
  values: ArrayLike<number>,
  nx: number,
  ny: number,
  stride = 1,
  offset = 0,
): number[][] {
  const out: number[][] = [];
  for (let j = 0; j < ny; j++) {
    const row: number[] = new Array<number>(nx);
    for (let i = 0; i < nx; i++) row[i] = values[(j * nx + i) * stride + offset]!;
    out.push(row);
  }
  return out;
}

/** Meaning of every token that occurs in the labels, for legends. */
export function legendOf(
  labels: readonly string[],
): { label: string; pixels: number; meaning: string }[] {
  const counts = new Map<string, number>();
  for (const l of labels) counts.set(l, (counts.get(l) ?? 0) + 1);
  return [...counts.entries()]
    .sort((a, b) => b[1] - a[1] || (a[0] < b[0] ? -1 : 1))
    .map(([label, pixels]) => ({
      label,
      pixels,
      meaning: label
        .split('+')
        .map((t) => TOKEN_MEANINGS[t] ?? t)
        .join('; '),
    }));
}

/**
 * The `map` output document of interfaces.md: grid coordinates, row-major labels
 * (`phase[j][i]` at (x[i], y[j])), energies, gaps, the 15 order parameters, refined boundaries,
 * plus the model, the plane, the version and the mean-field caution.
 */
export function mapToJson(map: PhaseMap): Record<string, unknown> {
  const [nx, ny] = map.input.plane.resolution;
  const order: Record<string, number[][]> = {};
  CHANNELS.forEach((name, k) => (order[name] = rows(map.order, nx, ny, 15, k)));
  const phase: string[][] = [];
  for (let j = 0; j < ny; j++) phase.push(map.labels.slice(j * nx, (j + 1) * nx));
  return {
    x: Array.from(map.x),
    y: Array.from(map.y),
    phase,
    energy: rows(map.energy, nx, ny),
    gap: rows(map.gap, nx, ny),
    order,
    boundaries: map.boundaries,
    phases: legendOf(map.labels),
    model: modelToJson(map.input.model),
    plane: map.input.plane,
    version: SOFTWARE_VERSION,
    caution: MEAN_FIELD_CAUTION,
  };
}

function csvField(value: string): string {
  return /[",\n]/.test(value) ? `"${value.replace(/"/g, '""')}"` : value;
}

/** One row per grid point: coordinates, label, energy, gap and the 15 order parameters. */
export function mapToCsv(map: PhaseMap): string {
  const [nx, ny] = map.input.plane.resolution;
  const xName = csvField(map.input.plane.x.label || 'x');
  const yName = csvField(map.input.plane.y.label || 'y');
  const lines = [
    `# ${MEAN_FIELD_CAUTION}`,
    `# fourfold ${SOFTWARE_VERSION}; model ${JSON.stringify(modelToJson(map.input.model))}`,
    [xName, yName, 'phase', 'energy', 'gap', ...CHANNELS].join(','),
  ];
  for (let j = 0; j < ny; j++) {
    for (let i = 0; i < nx; i++) {
      const p = j * nx + i;
      const order = Array.from(map.order.subarray(15 * p, 15 * p + 15), (v) => String(v));
      lines.push(
        [map.x[i], map.y[j], csvField(map.labels[p]!), map.energy[p], map.gap[p], ...order].join(
          ',',
        ),
      );
    }
  }
  return lines.join('\n') + '\n';
}
