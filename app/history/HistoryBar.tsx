import { useEffect, useRef } from 'react';
import { useFourfold } from '../store/index';
import './history.css';
import { goToStep, redoStep, undoStep } from './historyDriver';

/** Modifier that undo and redo take: Cmd on Apple keyboards, Ctrl elsewhere. */
const MOD = /Mac|iPhone|iPad/.test(globalThis.navigator?.platform ?? '') ? 'Cmd' : 'Ctrl';

/** Fields whose own undo (of the text typed) the shortcuts leave alone. */
function editsText(target: EventTarget | null): boolean {
  if (!(target instanceof HTMLElement)) return false;
  if (target.isContentEditable || target instanceof HTMLTextAreaElement) return true;
  if (!(target instanceof HTMLInputElement)) return false;
  return !['range', 'checkbox', 'radio', 'button', 'submit', 'reset', 'file', 'color'].includes(
    target.type,
  );
}

/**
 * Ctrl/Cmd+Z undoes the last setup or plane change, Ctrl/Cmd+Shift+Z (or Ctrl+Y) redoes it,
 * anywhere on the page except in a text field, where they undo the typing.
 */
function useHistoryKeys(): void {
  useEffect(() => {
    const onKey = (event: KeyboardEvent) => {
      if (!(event.ctrlKey || event.metaKey) || event.altKey || editsText(event.target)) return;
      const key = event.key.toLowerCase();
      if (key === 'z' && !event.shiftKey) undoStep();
      else if ((key === 'z' && event.shiftKey) || (key === 'y' && !event.shiftKey)) redoStep();
      else return;
      event.preventDefault();
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, []);
}

/**
 * Undo and redo of every setup and plane change, with the list of steps (each named by what it
 * changed; the shown one marked, undone ones after it greyed): a click on a step goes there.
 */
export function HistoryBar() {
  useHistoryKeys();
  const history = useFourfold((s) => s.history);
  const listRef = useRef<HTMLOListElement>(null);
  const { steps, index } = history;
  const undo = index > 0 ? steps[index]!.label : null;
  const redo = index + 1 < steps.length ? steps[index + 1]!.label : null;
  // The shown step stays in view in the list: looked at once per animation frame, and only
  // when the shown step or the number of steps changed (a slider drag changes the last step's
  // content many times a second, and each look forces a layout of the page).
  const count = steps.length;
  useEffect(() => {
    const frame = requestAnimationFrame(() =>
      listRef.current
        ?.querySelector('[aria-current="step"]')
        ?.scrollIntoView({ block: 'nearest', inline: 'nearest' }),
    );
    return () => cancelAnimationFrame(frame);
  }, [index, count]);
  return (
    <div className="history-bar" role="group" aria-label="Undo history">
      <button
        type="button"
        data-testid="history-undo"
        disabled={undo === null}
        title={undo === null ? 'Nothing to undo' : `Undo: ${undo} (${MOD}+Z)`}
        onClick={() => undoStep()}
      >
        Undo
      </button>
      <button
        type="button"
        data-testid="history-redo"
        disabled={redo === null}
        title={redo === null ? 'Nothing to redo' : `Redo: ${redo} (${MOD}+Shift+Z)`}
        onClick={() => redoStep()}
      >
        Redo
      </button>
      <details className="history-details">
        <summary data-testid="history-toggle">
          Steps{' '}
          <span className="history-count">
            {index + 1}/{steps.length}
          </span>
        </summary>
        <ol className="history-list" data-testid="history-list" ref={listRef}>
          {steps.map((step, k) => (
            <li
              key={`${k}-${step.at}`}
              data-testid="history-step"
              data-index={k}
              data-kind={step.kind}
              className={k > index ? 'history-undone' : undefined}
            >
              <button
                type="button"
                aria-current={k === index ? 'step' : undefined}
                onClick={() => goToStep(k)}
              >
                {step.label}
              </button>
            </li>
          ))}
        </ol>
      </details>
    </div>
  );
}
