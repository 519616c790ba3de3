import type { ChangeEvent } from 'react';
import { ModelError, QUOTED_PATH_LENGTH, errorLine, quoteInput } from '../../solver/index';
import { nameNextStep } from '../history/historyDriver';
import { useFourfold } from '../store/index';
import { DEMO_SETUP } from './demo';
import {
  SCENARIO_FILE_MAX_BYTES,
  downloadScenarioFile,
  readScenario,
  scenarioJson,
} from './scenarioFile';
import { scenarioHash } from './urlState';
import './scenarioBar.css';

async function loadScenarioFile(file: File): Promise<void> {
  const { setNotice, replaceSetup, replacePins } = useFourfold.getState();
  // The file's name in messages: quoted, at most 80 characters of it.
  const name = quoteInput(file.name, QUOTED_PATH_LENGTH);
  if (file.size > SCENARIO_FILE_MAX_BYTES) {
    setNotice({
      kind: 'error',
      text: `${name}: ${file.size} bytes is far more than a scenario (a few kilobytes); the setup is unchanged`,
    });
    return;
  }
  let text: string;
  try {
    text = await file.text();
  } catch (error) {
    setNotice({ kind: 'error', text: `${name}: could not be read (${errorLine(error)})` });
    return;
  }
  try {
    const loaded = readScenario(scenarioJson(text, name), name);
    nameNextStep({ label: `Loaded ${name}`, kind: 'load' });
    replaceSetup(loaded.setup);
    if (loaded.pins !== null) replacePins(loaded.pins);
    setNotice({
      kind: 'info',
      text: loaded.note === null ? `Loaded ${name}.` : `Loaded ${name}: ${loaded.note}.`,
    });
  } catch (error) {
    if (!(error instanceof ModelError)) throw error;
    setNotice({ kind: 'error', text: `${error.message}. The setup is unchanged.` });
  }
}

async function copyLink(): Promise<void> {
  const { setup, probe, setNotice } = useFourfold.getState();
  const { origin, pathname, search } = window.location;
  const hash = scenarioHash(setup, window.location.hash, probe.pins);
  // The address bar shows the same link at once (the debounced sync would do it shortly).
  window.history.replaceState(window.history.state, '', `${pathname}${search}${hash}`);
  const link = `${origin}${pathname}${search}${hash}`;
  try {
    await navigator.clipboard.writeText(link);
    setNotice({ kind: 'info', text: 'Link copied: it opens this exact setup.' });
  } catch {
    setNotice({
      kind: 'error',
      text: 'The browser did not allow copying; the link is in the address bar, copy it from there.',
    });
  }
}

/** Save, load and share the scenario (setup plus plane), and go back to the demo. */
export function ScenarioBar() {
  const onFile = (event: ChangeEvent<HTMLInputElement>) => {
    const file = event.currentTarget.files?.[0];
    // Cleared so that choosing the same file again loads it again.
    event.currentTarget.value = '';
    if (file) void loadScenarioFile(file);
  };

  return (
    <div className="scenario-bar" role="toolbar" aria-label="Scenario">
      <button
        type="button"
        data-testid="scenario-save"
        onClick={() => {
          const { setup, probe } = useFourfold.getState();
          downloadScenarioFile(setup, probe.pins);
        }}
      >
        Save scenario
      </button>
      <label className="scenario-load">
        <input
          className="visually-hidden"
          type="file"
          accept=".json,application/json"
          data-testid="scenario-file"
          onChange={onFile}
        />
        Load scenario…
      </label>
      <button type="button" data-testid="scenario-link" onClick={() => void copyLink()}>
        Copy link
      </button>
      <button
        type="button"
        className="scenario-demo"
        data-testid="scenario-demo"
        onClick={() => {
          const { replaceSetup, setNotice } = useFourfold.getState();
          nameNextStep({ label: 'Back to the demo', kind: 'demo' });
          replaceSetup(DEMO_SETUP);
          setNotice({
            kind: 'info',
            text: 'Back to the demo scenario (an invented model at ν = 0).',
          });
        }}
      >
        Back to demo
      </button>
    </div>
  );
}
