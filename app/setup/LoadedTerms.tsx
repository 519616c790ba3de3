import { CHANNELS } from '../../solver/index';
import { useFourfold } from '../store/index';
import { formatDisplay } from './numberEntry';

/**
 * Parts of a loaded model that have no field in the Setup (extra one-body terms, E_X in the gap
 * in dimensionless units, the file's name and description), shown read-only: they are kept as
 * they are, mapped, and saved with the scenario.
 */
export function LoadedTerms() {
  const oneBody = useFourfold((s) => s.setup.oneBody);
  const exchange = useFourfold((s) => (s.setup.physical ? undefined : s.setup.exchange));
  const name = useFourfold((s) => s.setup.name);
  const description = useFourfold((s) => s.setup.description);
  const terms = CHANNELS.filter((ch) => oneBody?.[ch] !== undefined);
  if (terms.length === 0 && exchange === undefined && !name && !description) return null;
  return (
    <fieldset className="setup-group loaded-terms" data-testid="loaded-terms">
      <legend>Also in the model</legend>
      {(name || description) && (
        <p data-testid="loaded-name">
          {name && <strong>{name}</strong>}
          {name && description ? ': ' : ''}
          {description}
        </p>
      )}
      {terms.length > 0 && (
        <p data-testid="loaded-one-body">
          One-body terms Σ <var>c</var>
          <sub>ab</sub> <var>G</var>
          <sub>ab</sub>:{' '}
          {terms.map((ch, k) => (
            <span key={ch}>
              {k > 0 ? ', ' : ''}
              <code>{ch}</code> × {formatDisplay(oneBody![ch]!)}
            </span>
          ))}
        </p>
      )}
      {exchange !== undefined && (
        <p data-testid="loaded-exchange">
          <var>E</var>
          <sub>X</sub> = {formatDisplay(exchange)} added to the quasiparticle gap
        </p>
      )}
      <p className="setup-hint">
        From the loaded scenario, read-only: kept as they are, mapped and saved with it.
      </p>
    </fieldset>
  );
}
