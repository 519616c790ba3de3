import type { Channel } from '../../solver/index';
import type { ChannelSetup, Setup } from '../scenario/setup';
import { useFourfold } from '../store/index';
import { couplingScale } from '../scenario/physical';
import { commitSetup } from './commitSetup';
import { COUPLING_RULE, formatDisplay } from './numberEntry';
import { NumberField } from './NumberField';
import { QuantityLabel } from './QuantityLabel';
import { sweptTargets, useSweptTargets } from './sweep';

type Common = 'uPerp' | 'uZ';

/** The channels each common coupling sets (public/notes.html#energy). */
export const COMMON_CHANNELS: Readonly<Record<Common, readonly Channel[]>> = {
  uPerp: ['x0', 'y0'],
  uZ: ['z0'],
};

function sameCoupling(a: ChannelSetup, b: ChannelSetup): boolean {
  return a.hartree === b.hartree && a.fock === b.fock;
}

/**
 * Fock value F of a common coupling, as typed (meV/T in physical units): its channels become
 * { fock: F, hartree: ratio * F } in the solver's unit.
 */
function commitFock(which: Common, typed: number): string | null {
  return commitSetup((s) => {
    const fock = typed * couplingScale(s);
    const channels = { ...s.channels };
    for (const ch of COMMON_CHANNELS[which]) {
      channels[ch] = { fock, hartree: s.ratios[which] * fock };
    }
    return { channels };
  });
}

/**
 * Hartree/Fock ratio of a common coupling: feeds an axis that sweeps it, and rescales the
 * Hartree part of its channels where no axis sets them.
 */
function commitRatio(which: Common, ratio: number): string | null {
  return commitSetup((s: Setup) => {
    const swept = sweptTargets(s);
    const channels = { ...s.channels };
    for (const ch of COMMON_CHANNELS[which]) {
      if (!swept.has(`${ch}.hartree`)) {
        channels[ch] = { fock: channels[ch].fock, hartree: ratio * channels[ch].fock };
      }
    }
    return { ratios: { ...s.ratios, [which]: ratio }, channels };
  });
}

function CommonCoupling({ which }: { readonly which: Common }) {
  const [first, second] = COMMON_CHANNELS[which];
  const scale = useFourfold((s) => couplingScale(s.setup));
  const fock = useFourfold((s) => s.setup.channels[first!].fock) / scale;
  const hartree = useFourfold((s) => s.setup.channels[first!].hartree) / scale;
  const fromRange = useFourfold((s) => s.setup.ranges?.[first!] !== undefined);
  const physical = useFourfold((s) => s.setup.physical !== undefined);
  const ratio = useFourfold((s) => s.setup.ratios[which]);
  const differs = useFourfold(
    (s) =>
      second !== undefined && !sameCoupling(s.setup.channels[first!], s.setup.channels[second]),
  );
  const swept = useSweptTargets();
  const sweepingName = useFourfold((s) =>
    s.setup.x.quantity === which ? 'x' : s.setup.y.quantity === which ? 'y' : null,
  );
  const sweepingAxis = useFourfold((s) => (sweepingName === null ? null : s.setup[sweepingName]));
  const sweptChannel = COMMON_CHANNELS[which]
    .flatMap((ch) => [`${ch}.fock`, `${ch}.hartree`])
    .map((target) => [target, swept.get(target)] as const)
    .find(([, axis]) => axis !== undefined);
  const id = `setup-${which}`;
  const name = which === 'uPerp' ? 'u_perp' : 'u_z';

  const fockField = (
    <NumberField
      id={`${id}-fock`}
      name={`${name} Fock`}
      ariaLabel={`${name} Fock coupling`}
      value={fock}
      rule={COUPLING_RULE}
      testId={`${id}-fock`}
      onCommit={(v) => commitFock(which, v)}
    />
  );

  let value;
  if (sweepingAxis !== null && physical && !fromRange) {
    // The axis sets the coupling across the Map; the value kept here is the sample's own,
    // which places its tilt path.
    value = (
      <>
        {fockField}
        <span
          className="setup-hint field-note"
          data-testid={`${id}-swept`}
          title={`The ${sweepingName} axis sets this coupling across the Map; the value here is the sample's own and places its tilt path.`}
        >
          sample; {sweepingName} axis sweeps the Map
        </span>
      </>
    );
  } else if (sweepingAxis !== null) {
    value = (
      <span
        className="swept-value"
        data-testid={`${id}-swept`}
        title={`set by the ${sweepingName} axis, from ${formatDisplay(sweepingAxis.from)} to ${formatDisplay(sweepingAxis.to)}`}
      >
        {sweepingName} axis
      </span>
    );
  } else if (sweptChannel !== undefined) {
    value = (
      <span className="swept-value" data-testid={`${id}-swept`}>
        {sweptChannel[0]} swept along {sweptChannel[1]}; edit the others in the channel table
      </span>
    );
  } else if (fromRange) {
    value = (
      <span className="swept-value" data-testid={`${id}-range`}>
        {formatDisplay(fock)} from range
      </span>
    );
  } else {
    value = fockField;
  }

  return (
    <tr>
      <th scope="row">
        <QuantityLabel quantity={which} />
        <span className="channel-list">{COMMON_CHANNELS[which].join(', ')}</span>
      </th>
      <td>
        {value}
        {differs && sweepingAxis === null && sweptChannel === undefined && (
          <span className="setup-hint field-note">
            {first} and {second} differ in the channel table; a value here sets both
          </span>
        )}
      </td>
      <td>
        <NumberField
          id={`${id}-ratio`}
          name={`${name} Hartree/Fock`}
          ariaLabel={`${name} Hartree per Fock`}
          value={ratio}
          rule={COUPLING_RULE}
          disabled={fromRange}
          testId={`${id}-ratio`}
          onCommit={(v) => commitRatio(which, v)}
        />
        {((sweepingAxis !== null && physical && !fromRange) ||
          (sweepingAxis === null && sweptChannel === undefined)) && (
          <span className="derived" data-testid={`${id}-hartree`}>
            <var>H</var> = {formatDisplay(hartree)}
          </span>
        )}
      </td>
    </tr>
  );
}

/** u⊥ (channels x0, y0) and u_z (channel z0): the couplings of the common anisotropic model. */
export function CommonCouplings() {
  const physical = useFourfold((s) => s.setup.physical !== undefined);
  const unit = physical ? <span className="setup-hint"> meV/T</span> : null;
  return (
    <fieldset className="setup-group">
      <legend>Common couplings</legend>
      <table className="coupling-table">
        <thead>
          <tr>
            <th scope="col">coupling</th>
            <th scope="col">
              Fock <var>F</var>
              {unit}
            </th>
            <th scope="col">
              <var>H</var> / <var>F</var>
            </th>
          </tr>
        </thead>
        <tbody>
          <CommonCoupling which="uPerp" />
          <CommonCoupling which="uZ" />
        </tbody>
      </table>
      <p className="setup-hint">
        The Hartree part is <var>H</var> = ratio × <var>F</var>. For a contact interaction{' '}
        <var>H</var> = <var>F</var> (ratio 1); a finite range makes them differ. The ratio also sets
        the Hartree part of an axis that sweeps the coupling.
      </p>
    </fieldset>
  );
}
