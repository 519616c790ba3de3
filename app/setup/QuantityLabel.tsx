import { memo } from 'react';
import type { Channel } from '../../solver/index';
import type { AxisQuantity } from '../scenario/setup';

/**
 * Typeset name of a quantity the Setup edits or an axis sweeps (u⊥, u_z, E_Z, Δ_V, u_ab).
 * Memoised: it sits beside fields that re-render on every step of a slider.
 */
export const QuantityLabel = memo(function QuantityLabel({
  quantity,
  customLabel,
}: {
  readonly quantity: AxisQuantity;
  readonly customLabel?: string;
}) {
  switch (quantity) {
    case 'uPerp':
      return (
        <span className="sym">
          <var>u</var>
          <sub>⊥</sub>
        </span>
      );
    case 'uZ':
      return (
        <span className="sym">
          <var>u</var>
          <sub>z</sub>
        </span>
      );
    case 'zeeman':
      return (
        <span className="sym">
          <var>E</var>
          <sub>Z</sub>
        </span>
      );
    case 'valleyZeeman':
      return (
        <span className="sym">
          Δ<sub>V</sub>
        </span>
      );
    case 'custom':
      return <span className="sym custom-label">{customLabel || 'custom'}</span>;
    default:
      return (
        <span className="sym">
          <var>u</var>
          <sub>{quantity}</sub>
        </span>
      );
  }
});

/**
 * The matrix of a channel, tau_a (x) sigma_b (public/notes.html#basis), with identity factors left
 * out.
 */
export function ChannelMatrix({ channel }: { readonly channel: Channel }) {
  const [valley, spin] = channel;
  const tau =
    valley === '0' ? null : (
      <>
        τ<sub>{valley}</sub>
      </>
    );
  const sigma =
    spin === '0' ? null : (
      <>
        σ<sub>{spin}</sub>
      </>
    );
  return (
    <span className="sym">
      {tau}
      {tau && sigma ? ' ⊗ ' : null}
      {sigma}
    </span>
  );
}

/** Plain-text name of an axis quantity, for select options (which cannot hold markup). */
export function quantityText(quantity: AxisQuantity, customLabel = ''): string {
  switch (quantity) {
    case 'uPerp':
      return 'u⊥ (channels x0, y0)';
    case 'uZ':
      return 'u_z (channel z0)';
    case 'zeeman':
      return 'E_Z (Zeeman)';
    case 'valleyZeeman':
      return 'Δ_V (sublattice splitting)';
    case 'custom':
      return `custom, from the file${customLabel ? `: ${customLabel}` : ''}`;
    default:
      return `channel ${quantity}`;
  }
}
