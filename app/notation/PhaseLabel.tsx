import { Fragment } from 'react';
import { phaseExplanation, tokenExplanation } from './explanations';
import { Term } from './Term';

/**
 * A phase label with what it means on hover and focus: each token ('CDW', 'SBxy') explained on
 * its own, joined by '+' as the label is. `whole`: one explanation for the whole label instead
 * (where the tokens are too small a target, as in a table cell).
 */
export function PhaseLabel({ label, whole = false }: { label: string; whole?: boolean }) {
  if (label === '') return <>…</>;
  if (whole) return <Term explain={phaseExplanation(label)}>{label}</Term>;
  return (
    <>
      {label.split('+').map((token, k) => (
        <Fragment key={k}>
          {k > 0 && '+'}
          <Term explain={`${token}: ${tokenExplanation(token)}`}>{token}</Term>
        </Fragment>
      ))}
    </>
  );
}
