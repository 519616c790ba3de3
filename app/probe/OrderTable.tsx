import { formatFixed } from '../format';

const PAULI_LETTERS = ['0', 'x', 'y', 'z'] as const;

/** Below this magnitude an order parameter is drawn as absent. */
const ORDER_TOLERANCE = 1e-6;

interface OrderTableProps {
  /** o_ab = tr(G_ab P) keyed by the two-letter channel name (valley letter, then spin letter). */
  order: Readonly<Record<string, number>>;
}

/** The 15 order parameters laid out as valley letter (rows) by spin letter (columns). */
export function OrderTable({ order }: OrderTableProps) {
  return (
    <table className="order-table" data-testid="order-table">
      <caption>
        Order parameters o<sub>ab</sub> = tr(G<sub>ab</sub> P), G<sub>ab</sub> = τ<sub>a</sub> ⊗ σ
        <sub>b</sub>
      </caption>
      <thead>
        <tr>
          <th scope="col" className="corner">
            τ \ σ
          </th>
          {PAULI_LETTERS.map((spin) => (
            <th scope="col" key={spin}>
              {spin}
            </th>
          ))}
        </tr>
      </thead>
      <tbody>
        {PAULI_LETTERS.map((valley) => (
          <tr key={valley}>
            <th scope="row">{valley}</th>
            {PAULI_LETTERS.map((spin) => {
              const channel = valley + spin;
              if (channel === '00') {
                return (
                  <td key={channel} className="identity" title="tr P counts the electrons">
                    –
                  </td>
                );
              }
              const value = order[channel];
              const present = value !== undefined && Math.abs(value) > ORDER_TOLERANCE;
              return (
                <td
                  key={channel}
                  data-channel={channel}
                  className={present ? 'present' : undefined}
                  title={channel}
                >
                  {value === undefined ? '?' : formatFixed(value, 4)}
                </td>
              );
            })}
          </tr>
        ))}
      </tbody>
    </table>
  );
}
