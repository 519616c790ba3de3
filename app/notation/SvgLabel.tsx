import { labelPieces } from './labelPieces';

/** Baseline shifts relative to the font size: a subscript down, a superscript up. */
const SHIFT = { [-1]: 0.3, 0: 0, 1: -0.4 } as const;

/**
 * A plain-text label as the content of an SVG <text> in the app's notation (`labelPieces`):
 * variables in italic, subscripts and superscripts as smaller shifted tspans, then `suffix` on
 * the baseline. `fontSize` is the text's size in CSS pixels (the shifts are in pixels).
 */
export function SvgLabel({
  label,
  fontSize,
  suffix,
}: {
  readonly label: string;
  readonly fontSize: number;
  readonly suffix?: string;
}) {
  let level: -1 | 0 | 1 = 0;
  const spans = labelPieces(label).map((piece, k) => {
    const dy = (SHIFT[piece.level] - SHIFT[level]) * fontSize;
    level = piece.level;
    return (
      <tspan
        key={k}
        dy={dy === 0 ? undefined : dy}
        fontStyle={piece.italic ? 'italic' : undefined}
        fontSize={piece.level === 0 ? undefined : 0.72 * fontSize}
      >
        {piece.text}
      </tspan>
    );
  });
  const back = -SHIFT[level] * fontSize;
  return (
    <>
      {spans}
      {suffix !== undefined && <tspan dy={back === 0 ? undefined : back}>{suffix}</tspan>}
    </>
  );
}
