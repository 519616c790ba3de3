/**
 * Fourfold's one notation for symbols. Labels are written in plain ASCII where a file or a
 * command line holds them ('u_perp', 'u_z', 'E_Z', 'Delta_V', 'theta', 'nu': the model file's
 * axis labels, CSV headers, `--title`), and read the same way everywhere they are shown: the
 * app's panels (`AxisName`), the exported figures and the CLI's figures (`typesetLabel`) and
 * plain text such as a menu option or a tooltip (`labelText`). Pure, no DOM: the CLI uses it.
 */

/** Greek letters and symbols written by name in labels ('Delta_V', 'theta', 'u_perp'). */
export const NAMED_SYMBOLS: Readonly<Record<string, string>> = {
  alpha: '\u03b1',
  beta: '\u03b2',
  gamma: '\u03b3',
  delta: '\u03b4',
  epsilon: '\u03b5',
  eta: '\u03b7',
  theta: '\u03b8',
  kappa: '\u03ba',
  lambda: '\u03bb',
  mu: '\u03bc',
  nu: '\u03bd',
  pi: '\u03c0',
  rho: '\u03c1',
  sigma: '\u03c3',
  tau: '\u03c4',
  phi: '\u03c6',
  chi: '\u03c7',
  psi: '\u03c8',
  omega: '\u03c9',
  Gamma: '\u0393',
  Delta: '\u0394',
  Theta: '\u0398',
  Lambda: '\u039b',
  Pi: '\u03a0',
  Sigma: '\u03a3',
  Phi: '\u03a6',
  Psi: '\u03a8',
  Omega: '\u03a9',
  perp: '\u22a5',
  par: '\u2225',
};

/** Baseline (0), subscript (-1) or superscript (1). */
export type LabelLevel = 0 | -1 | 1;

/** A run of a label's characters set alike. */
export interface LabelPiece {
  readonly text: string;
  /** A variable (a single Latin letter carrying a script, or the whole label). */
  readonly italic: boolean;
  readonly level: LabelLevel;
}

/**
 * Reads a plain-text label: `_x` or `_{...}` makes a subscript, `^x` or `^{...}` a superscript;
 * Greek names ('Delta', 'theta') and 'perp' become their symbols; a single Latin letter outside
 * parentheses that carries a sub- or superscript, or is the whole label, is a variable (italic),
 * everything else upright. 'u_perp' is u (italic) with subscript ⊥, 'E_Z' E with subscript Z,
 * 'B_tot (T)' B with subscript tot then ' (T)'.
 */
export function labelPieces(label: string): LabelPiece[] {
  const pieces: { text: string; italic: boolean; level: LabelLevel }[] = [];
  let depth = 0;
  const push = (text: string, italic: boolean, level: LabelLevel) => {
    const last = pieces[pieces.length - 1];
    if (last && last.italic === italic && last.level === level) last.text += text;
    else pieces.push({ text, italic, level });
  };
  const word = (w: string, level: LabelLevel, variable = false) => {
    const named = NAMED_SYMBOLS[w];
    if (named !== undefined) push(named, false, level);
    else push(w, variable && depth === 0 && /^[A-Za-z]$/.test(w), level);
  };
  const tokens = label.match(/[A-Za-z]+|[0-9.]+|[_^]\{[^}]*\}|[_^][A-Za-z0-9]+|./gu) ?? [];
  for (let k = 0; k < tokens.length; k++) {
    const t = tokens[k]!;
    if (t.startsWith('_') || t.startsWith('^')) {
      const level: LabelLevel = t[0] === '_' ? -1 : 1;
      const body = t[1] === '{' ? t.slice(2, -1) : t.slice(1);
      for (const part of body.match(/[A-Za-z]+|[^A-Za-z]+/g) ?? []) {
        if (/^[A-Za-z]+$/.test(part)) word(part, level);
        else push(part, false, level);
      }
      continue;
    }
    if (t === '(') depth++;
    if (t === ')') depth = Math.max(0, depth - 1);
    // A lone letter is a variable when scripted or when it is the whole label ('x'); 'Sample A'
    // and the unit in '9 T' stay upright.
    const scripted = /^[_^]/.test(tokens[k + 1] ?? '');
    if (/^[A-Za-z]+$/.test(t)) word(t, 0, scripted || tokens.length === 1);
    else push(t, false, 0);
  }
  return pieces;
}

/**
 * A label as plain text in the same notation, for places that hold no markup (a menu option, a
 * tooltip, an accessible name): symbols replace their names, a subscript that is a symbol
 * follows its base directly and any other is written after '_', a superscript after '^':
 * 'u_perp' -> 'u⊥', 'u_z' -> 'u_z', 'Delta_V' -> 'Δ_V', 'theta' -> 'θ', 'nu' -> 'ν'.
 */
export function labelText(label: string): string {
  return labelPieces(label)
    .map((p) => {
      if (p.level === 0) return p.text;
      if (p.level === 1) return `^${p.text}`;
      return /^[^A-Za-z0-9]$/u.test(p.text) ? p.text : `_${p.text}`;
    })
    .join('');
}
