import type { CutResult } from './cut';
import { csvComment, csvText } from './csvText';
import { modelToJson } from './model';
import { ORDER_GROUPS } from './orderParameters';
import type { MapInput } from './plane';
import { MEAN_FIELD_CAUTION, SOFTWARE_VERSION } from './version';

const DEGREES = 180 / Math.PI;

/** A number for JSON: NaN (no spin moment, so no canting) becomes null. */
function finiteOrNull(v: number): number | null {
  return Number.isFinite(v) ? v : null;
}

/**
 * The `cut` output document: the samples (t from 0 to 1; the horizontal quantity s, the swept
 * value or the distance along a slanted line; plane coordinates), labels, energy, dE/ds, gap,
 * canting angle in degrees, the magnitude of every order-parameter group, the located
 * transitions, plus the model, the plane, the path, the version and the mean-field caution.
 */
export function cutToJson(cut: CutResult, input: MapInput): Record<string, unknown> {
  const n = cut.t.length;
  const groups: Record<string, number[]> = {};
  ORDER_GROUPS.forEach((g, k) => {
    groups[g.key] = Array.from({ length: n }, (_, i) => cut.groups[ORDER_GROUPS.length * i + k]!);
  });
  return {
    axis: cut.axis,
    t: Array.from(cut.t),
    s: Array.from(cut.s),
    x: Array.from(cut.x),
    y: Array.from(cut.y),
    phase: cut.labels,
    energy: Array.from(cut.energy),
    slope: Array.from(cut.slope),
    gap: Array.from(cut.gap),
    cantingDeg: Array.from(cut.canting, (v) => finiteOrNull(v * DEGREES)),
    groups,
    transitions: cut.transitions,
    path: cut.path,
    model: modelToJson(input.model),
    plane: input.plane,
    version: SOFTWARE_VERSION,
    caution: MEAN_FIELD_CAUTION,
  };
}

/**
 * One row per sample: t, the horizontal quantity, plane coordinates, label, energy, dE/ds, gap,
 * canting (degrees, empty without a spin moment) and the eight group magnitudes; the caution,
 * the model and each transition as `#` comment lines above the header (one line each, whatever
 * the axis names hold). Text cells are written by `csvText`, numbers as they are.
 */
export function cutToCsv(cut: CutResult, input: MapInput): string {
  const x = input.plane.x.label || 'x';
  const y = input.plane.y.label || 'y';
  const s = cut.axis.label || 's';
  const lines = [
    csvComment(MEAN_FIELD_CAUTION),
    csvComment(`fourfold ${SOFTWARE_VERSION}; model ${JSON.stringify(modelToJson(input.model))}`),
    csvComment(`path ${JSON.stringify(cut.path)}`),
    ...cut.transitions.map((tr) =>
      csvComment(
        `transition ${tr.between[0]} -> ${tr.between[1]} (${tr.order}) at t = ${tr.t}, ${csvText(s)} = ${tr.s}, ${csvText(x)} = ${tr.x}, ${csvText(y)} = ${tr.y}`,
      ),
    ),
    [
      't',
      s,
      x,
      y,
      'phase',
      'energy',
      'slope',
      'gap',
      'canting_deg',
      ...ORDER_GROUPS.map((g) => g.key),
    ]
      .map(csvText)
      .join(','),
  ];
  for (let i = 0; i < cut.t.length; i++) {
    const canting = cut.canting[i]!;
    lines.push(
      [
        cut.t[i],
        cut.s[i],
        cut.x[i],
        cut.y[i],
        csvText(cut.labels[i]!),
        cut.energy[i],
        cut.slope[i],
        cut.gap[i],
        Number.isFinite(canting) ? canting * DEGREES : '',
        ...Array.from(cut.groups.subarray(ORDER_GROUPS.length * i, ORDER_GROUPS.length * (i + 1))),
      ].join(','),
    );
  }
  return lines.join('\n') + '\n';
}
