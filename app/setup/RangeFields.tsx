import { useState } from 'react';
import { CHANNELS, RANGE_PROFILES, type Channel, type RangeProfile } from '../../solver/index';
import { RANGE_RULE, couplingScale } from '../scenario/physical';
import type { RangeSetup, Setup } from '../scenario/setup';
import { useFourfold } from '../store/index';
import { commitSetup } from './commitSetup';
import { COMMON_CHANNELS } from './CommonCouplings';
import { COUPLING_RULE, formatDisplay } from './numberEntry';
import { NumberField } from './NumberField';
import { quantityText } from './QuantityLabel';
import { RangeChart } from './RangeChart';

/** What a range sets: a common coupling (both its channels) or one channel. */
type RangeTarget = 'uPerp' | 'uZ' | Channel;

const TARGETS: readonly RangeTarget[] = ['uPerp', 'uZ', ...CHANNELS];

function channelsOf(target: RangeTarget): readonly Channel[] {
  return target === 'uPerp' || target === 'uZ' ? COMMON_CHANNELS[target] : [target];
}

const PROFILE_TEXT: Readonly<Record<RangeProfile, string>> = {
  gaussian: 'Gaussian, g exp(−q²a²/2)',
  screened: 'screened, g / (1 + q²a²)',
  contact: 'contact, g',
};

/** The ranges with `target`'s channels set to `range` (or removed when null). */
function rangesWith(s: Setup, target: RangeTarget, range: RangeSetup | null): Setup['ranges'] {
  const out = { ...(s.ranges ?? {}) };
  for (const ch of channelsOf(target)) {
    if (range === null) delete out[ch];
    else out[ch] = range;
  }
  return Object.keys(out).length > 0 ? out : undefined;
}

function commitRange(target: RangeTarget, change: Partial<RangeSetup> | null): string | null {
  return commitSetup((s) => {
    const first = channelsOf(target)[0]!;
    if (change === null) return { ranges: rangesWith(s, target, null) };
    const current = s.ranges?.[first] ?? {
      profile: 'screened' as const,
      // Start from the channel's typed Hartree coupling (or 1) so the Map moves gently.
      strength: s.channels[first].hartree / couplingScale(s) || 1,
      range: s.physical ? 5 : 0.5,
    };
    return { ranges: rangesWith(s, target, { ...current, ...change }) };
  });
}

function Value({ testId, name, value }: { testId: string; name: string; value: number }) {
  return (
    <span data-testid={testId} data-value={value}>
      {name} = {formatDisplay(Number(value.toPrecision(5)))}
    </span>
  );
}

/**
 * Hartree and Fock couplings of a channel from an interaction's strength, range and profile
 * (public/notes.html#interaction-range), instead of typing them; shows F/H against the field.
 */
export function RangeFields() {
  const [target, setTarget] = useState<RangeTarget>('uPerp');
  const first = channelsOf(target)[0]!;
  const range = useFourfold((s) => s.setup.ranges?.[first] ?? null);
  const physical = useFourfold((s) => s.setup.physical ?? null);
  const scale = physical?.bPerpTesla ?? 1;
  const coupling = useFourfold((s) => s.setup.channels[first]);
  const unit = physical ? ' meV/T' : '';
  return (
    <details className="setup-group channel-details range-editor" data-testid="range">
      <summary>Interaction range</summary>
      <div className="axis-row">
        <label htmlFor="range-target">coupling</label>
        <select
          id="range-target"
          value={target}
          data-testid="range-target"
          onChange={(event) => setTarget(event.currentTarget.value as RangeTarget)}
        >
          {TARGETS.map((t) => (
            <option key={t} value={t}>
              {quantityText(t)}
            </option>
          ))}
        </select>
      </div>
      <label className="choice">
        <input
          type="checkbox"
          checked={range !== null}
          data-testid="range-enabled"
          onChange={(event) => commitRange(target, event.currentTarget.checked ? {} : null)}
        />
        H and F from an interaction range
      </label>
      {range !== null && (
        <>
          <div className="axis-row">
            <label htmlFor="range-profile">profile v(q)</label>
            <select
              id="range-profile"
              value={range.profile}
              data-testid="range-profile"
              onChange={(event) =>
                commitRange(target, { profile: event.currentTarget.value as RangeProfile })
              }
            >
              {RANGE_PROFILES.map((p) => (
                <option key={p} value={p}>
                  {PROFILE_TEXT[p]}
                </option>
              ))}
            </select>
          </div>
          <div className="physical-entries">
            <NumberField
              id="range-strength"
              name="range strength"
              label={<>H{physical ? ' (meV/T)' : ''}</>}
              value={range.strength}
              rule={COUPLING_RULE}
              testId="range-strength"
              onCommit={(v) => commitRange(target, { strength: v })}
            />
            <NumberField
              id="range-length"
              name="range a"
              label={<>a ({physical ? 'nm' : 'l_B'})</>}
              value={range.range}
              rule={RANGE_RULE}
              disabled={range.profile === 'contact'}
              testId="range-length"
              onCommit={(v) => commitRange(target, { range: v })}
            />
          </div>
          <div className="range-values" data-testid="range-values">
            <Value testId="range-hartree" name={`H${unit}`} value={coupling.hartree / scale} />
            <Value testId="range-fock" name={`F${unit}`} value={coupling.fock / scale} />
            <Value
              testId="range-ratio"
              name="F/H"
              value={coupling.hartree !== 0 ? coupling.fock / coupling.hartree : NaN}
            />
          </div>
          {range.profile !== 'contact' && <RangeChart range={range} physical={physical} />}
        </>
      )}
      <p className="setup-hint">
        The strength is the Hartree coupling <var>H</var> = <var>v</var>(0) / 2π<var>l</var>
        <sub>B</sub>
        <sup>2</sup>; <var>F</var> = (1/2π) ∫ <var>q</var> d<var>q</var> <var>v</var>(<var>q</var>)
        exp(−<var>q</var>
        <sup>2</sup>
        <var>l</var>
        <sub>B</sub>
        <sup>2</sup>/2) by quadrature. A contact interaction has <var>F</var> = <var>H</var>; a
        longer range lowers <var>F</var>/<var>H</var>, and a stronger field (shorter <var>l</var>
        <sub>B</sub>) lowers it further.
      </p>
    </details>
  );
}
