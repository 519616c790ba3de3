import { labelColours } from '../figure/palette';
import { tokenExplanation } from '../notation/explanations';

export interface LegendEntry {
  readonly label: string;
  /** Colours of the label's tokens (several for a composite: drawn as stripes). */
  readonly colours: readonly string[];
  /** What the tokens stand for, '; '-separated. */
  readonly meaning: string;
  /** Fraction of all grid pixels (pixels not computed yet count in the total). */
  readonly share: number;
}

/**
 * Pixels per label, largest first (ties by name), as the solver's `legendOf` orders them. One
 * pass that looks a label up only where it differs from the previous pixel's (a Map row is
 * mostly runs of one label), so that a live Map can recount often.
 */
export function labelCounts(labels: readonly string[]): { label: string; pixels: number }[] {
  const counts = new Map<string, number>();
  let run = labels[0];
  let length = 0;
  for (const label of labels) {
    if (label === run) {
      length++;
      continue;
    }
    counts.set(run!, (counts.get(run!) ?? 0) + length);
    run = label;
    length = 1;
  }
  if (length > 0) counts.set(run!, (counts.get(run!) ?? 0) + length);
  return [...counts]
    .sort((a, b) => b[1] - a[1] || (a[0] < b[0] ? -1 : 1))
    .map(([label, pixels]) => ({ label, pixels }));
}

/** One entry per computed label, largest area first (ties by name, as legendOf orders them). */
export function legendEntries(labels: readonly string[]): LegendEntry[] {
  const total = labels.length;
  return labelCounts(labels)
    .filter((entry) => entry.label !== '')
    .map((entry) => ({
      label: entry.label,
      colours: labelColours(entry.label),
      meaning: entry.label.split('+').map(tokenExplanation).join('; '),
      share: total > 0 ? entry.pixels / total : 0,
    }));
}

/** A share as a short percentage: '37%', '4.2%', '<0.1%'. */
export function formatShare(share: number): string {
  const percent = 100 * share;
  if (percent > 0 && percent < 0.1) return '<0.1%';
  return `${percent >= 10 ? Math.round(percent) : Number(percent.toFixed(1))}%`;
}
