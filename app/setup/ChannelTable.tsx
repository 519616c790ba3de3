import { CHANNELS, type Channel } from '../../solver/index';
import type { ChannelSetup, Setup } from '../scenario/setup';
import { useFourfold } from '../store/index';
import { couplingScale } from '../scenario/physical';
import { commitSetup } from './commitSetup';
import { COMMON_CHANNELS } from './CommonCouplings';
import { COUPLING_RULE } from './numberEntry';
import { NumberField } from './NumberField';
import { ChannelMatrix } from './QuantityLabel';
import { sweptTargets, useSweptTargets } from './sweep';

type Part = keyof ChannelSetup;

/**
 * A common coupling's ratio follows the table when the edited channel is one of its own, its
 * channels agree and no axis sets them (then the ratio feeds that axis and must stay), so the
 * two views never tell different stories.
 */
function ratiosFollowing(s: Setup, channels: Setup['channels'], edited: Channel): Setup['ratios'] {
  const swept = sweptTargets(s);
  const out = { ...s.ratios };
  for (const which of ['uPerp', 'uZ'] as const) {
    const own = COMMON_CHANNELS[which];
    if (!own.includes(edited)) continue;
    if (own.some((ch) => swept.has(`${ch}.fock`) || swept.has(`${ch}.hartree`))) continue;
    const [first, ...rest] = own.map((ch) => channels[ch]);
    const agree = rest.every((c) => c.hartree === first!.hartree && c.fock === first!.fock);
    if (agree && first!.fock !== 0) out[which] = first!.hartree / first!.fock;
  }
  return out;
}

/** A channel's Hartree or Fock value as typed (meV/T in physical units). */
function commitChannel(channel: Channel, part: Part, typed: number): string | null {
  return commitSetup((s) => {
    const value = typed * couplingScale(s);
    const channels = { ...s.channels, [channel]: { ...s.channels[channel], [part]: value } };
    return { channels, ratios: ratiosFollowing(s, channels, channel) };
  });
}

function ChannelRow({ channel }: { readonly channel: Channel }) {
  const scale = useFourfold((s) => couplingScale(s.setup));
  const hartree = useFourfold((s) => s.setup.channels[channel].hartree) / scale;
  const fock = useFourfold((s) => s.setup.channels[channel].fock) / scale;
  const fromRange = useFourfold((s) => s.setup.ranges?.[channel] !== undefined);
  // In physical units a swept channel keeps the sample's value, which places its tilt path.
  const physical = useFourfold((s) => s.setup.physical !== undefined);
  const swept = useSweptTargets();
  const sweptHartree = swept.get(`${channel}.hartree`);
  const sweptFock = swept.get(`${channel}.fock`);
  const notes = [...new Set([sweptHartree, sweptFock].filter((axis) => axis !== undefined))].map(
    (axis) => `swept along ${axis}`,
  );
  if (fromRange) notes.push('from range');
  const rowClass = notes.length > 0 ? 'is-swept' : undefined;
  return (
    <>
      <tr data-channel={channel} className={rowClass}>
        <th scope="row">
          <code>{channel}</code>
          <span className="channel-matrix">
            <ChannelMatrix channel={channel} />
          </span>
        </th>
        <td>
          <NumberField
            id={`channel-${channel}-hartree`}
            name={`${channel}.hartree`}
            ariaLabel={`${channel} Hartree`}
            value={hartree}
            rule={COUPLING_RULE}
            disabled={(sweptHartree !== undefined && !physical) || fromRange}
            testId={`channel-${channel}-hartree`}
            onCommit={(v) => commitChannel(channel, 'hartree', v)}
          />
        </td>
        <td>
          <NumberField
            id={`channel-${channel}-fock`}
            name={`${channel}.fock`}
            ariaLabel={`${channel} Fock`}
            value={fock}
            rule={COUPLING_RULE}
            disabled={(sweptFock !== undefined && !physical) || fromRange}
            testId={`channel-${channel}-fock`}
            onCommit={(v) => commitChannel(channel, 'fock', v)}
          />
        </td>
      </tr>
      {notes.length > 0 && (
        <tr className={`channel-note ${rowClass}`} data-note-for={channel}>
          <td colSpan={3} className="setup-hint">
            {channel}: {notes.join('; ')}
          </td>
        </tr>
      )}
    </>
  );
}

/**
 * All 15 channels tau_a (x) sigma_b with their Hartree and Fock couplings (public/notes.html#basis
 * and public/notes.html#energy), for generic models; collapsed by default.
 */
export function ChannelTable() {
  const active = useFourfold(
    (s) =>
      CHANNELS.filter((ch) => s.setup.channels[ch].hartree !== 0 || s.setup.channels[ch].fock !== 0)
        .length,
  );
  const physical = useFourfold((s) => s.setup.physical !== undefined);
  return (
    <details className="setup-group channel-details">
      <summary>
        All 15 channels{' '}
        <span className="setup-hint">
          ({active} nonzero{physical ? '; meV/T' : ''})
        </span>
      </summary>
      <table className="coupling-table channel-table">
        <thead>
          <tr>
            <th scope="col">channel</th>
            <th scope="col">
              Hartree <var>H</var>
            </th>
            <th scope="col">
              Fock <var>F</var>
            </th>
          </tr>
        </thead>
        <tbody>
          {CHANNELS.map((channel) => (
            <ChannelRow key={channel} channel={channel} />
          ))}
        </tbody>
      </table>
      <p className="setup-hint">
        A swept channel takes its values from the axis across the plane; the numbers kept here
        return when the axis moves to another quantity.
      </p>
    </details>
  );
}
