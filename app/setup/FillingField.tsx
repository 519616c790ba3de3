import type { Filling } from '../../solver/index';
import { useFourfold } from '../store/index';
import { commitSetup } from './commitSetup';
import { electronsPerFluxQuantum } from './fillingCount';

const FILLINGS: readonly { readonly value: Filling; readonly text: string }[] = [
  { value: -1, text: '−1' },
  { value: 0, text: '0' },
  { value: 1, text: '+1' },
];

/** Filling factor nu of the zero-energy level (public/notes.html#setting). */
export function FillingField() {
  const filling = useFourfold((s) => s.setup.filling);
  return (
    <fieldset className="setup-group">
      <legend>
        Filling factor <var>ν</var>
      </legend>
      <div className="choices">
        {FILLINGS.map(({ value, text }) => (
          <label key={value} className="choice">
            <input
              type="radio"
              name="setup-filling"
              value={value}
              checked={filling === value}
              data-testid={`filling-${value}`}
              onChange={() => commitSetup({ filling: value })}
            />
            <var>ν</var> = {text}
          </label>
        ))}
      </div>
      <p className="setup-hint" data-testid="filling-electrons">
        The n = 0 level holds {electronsPerFluxQuantum(filling)} (<var>ν</var> + 2 of its four
        spin-valley states filled).
      </p>
    </fieldset>
  );
}
