import { Fragment, type ReactNode } from 'react';
import { symbolExplanation } from '../notation/explanations';
import { labelPieces } from '../notation/labelPieces';
import { Term } from '../notation/Term';

/**
 * Typeset name of a plane axis or symbol from its plain-text label (u_perp, u_z, E_Z, Delta_V,
 * theta, u_xy), in the notation the figures use (`labelPieces`). With `explain`, what the symbol
 * is shows on hover and focus (symbols the notes do not name show as they are).
 */
export function AxisName({ label, explain = false }: { label: string; explain?: boolean }) {
  const content = labelPieces(label || 'axis').map((piece, k): ReactNode => {
    const text = piece.italic ? <var>{piece.text}</var> : piece.text;
    if (piece.level === -1) return <sub key={k}>{text}</sub>;
    if (piece.level === 1) return <sup key={k}>{text}</sup>;
    return <Fragment key={k}>{text}</Fragment>;
  });
  return explain ? <Term explain={symbolExplanation(label)}>{content}</Term> : <>{content}</>;
}
