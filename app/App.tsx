import { useEffect, useRef, useState } from 'react';
import { createSolveClient, type SolveClient, type SolveJson } from '../workers/solveClient';
import { EXAMPLE_MODEL_TEXT } from './exampleModel';
import { MeanFieldCautions } from './probe/MeanFieldCautions';
import { ProbeResult } from './probe/ProbeResult';

function oneLine(message: string): string {
  return message.split('\n', 1)[0]?.trim() || 'Unknown error';
}

function errorMessage(error: unknown): string {
  return oneLine(error instanceof Error ? error.message : String(error));
}

export function App() {
  const [modelText, setModelText] = useState(EXAMPLE_MODEL_TEXT);
  const [result, setResult] = useState<SolveJson | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [solving, setSolving] = useState(false);
  const clientRef = useRef<SolveClient | null>(null);
  const latestRequest = useRef(0);

  useEffect(() => {
    const client = createSolveClient();
    clientRef.current = client;
    return () => {
      clientRef.current = null;
      client.dispose();
    };
  }, []);

  async function handleSolve() {
    const client = clientRef.current;
    if (!client) return;
    const request = ++latestRequest.current;

    let modelJson: unknown;
    try {
      modelJson = JSON.parse(modelText);
    } catch (parseError) {
      setError(`The model is not valid JSON: ${errorMessage(parseError)}`);
      return;
    }

    setSolving(true);
    try {
      const solved = await client.solvePoint(modelJson);
      if (request !== latestRequest.current) return;
      setResult(solved);
      setError(null);
    } catch (solveError) {
      if (request !== latestRequest.current) return;
      setError(errorMessage(solveError));
    } finally {
      if (request === latestRequest.current) setSolving(false);
    }
  }

  return (
    <div className="page">
      <header className="masthead">
        <h1>Fourfold</h1>
        <p>Hartree-Fock ground states of graphene&rsquo;s zero-energy Landau level</p>
      </header>
      <main className="panels">
        <section className="panel" aria-labelledby="setup-heading">
          <h2 id="setup-heading">Setup</h2>
          <label htmlFor="model-text">Model (JSON)</label>
          <textarea
            id="model-text"
            data-testid="model"
            value={modelText}
            spellCheck={false}
            rows={14}
            onChange={(event) => setModelText(event.target.value)}
            onKeyDown={(event) => {
              if (event.key === 'Enter' && (event.ctrlKey || event.metaKey)) void handleSolve();
            }}
          />
          <div className="actions">
            <button type="button" data-testid="solve" onClick={() => void handleSolve()}>
              Solve
            </button>
            <span className="hint">{solving ? 'Solving…' : 'Ctrl + Enter also solves'}</span>
          </div>
          {error !== null && (
            <p className="error" role="alert" data-testid="error">
              {error}
            </p>
          )}
          {error !== null && result !== null && (
            <p className="hint">The Probe still shows the last model that solved.</p>
          )}
        </section>
        <section className="panel" aria-labelledby="probe-heading">
          <h2 id="probe-heading">Probe</h2>
          {result ? (
            <ProbeResult result={result} />
          ) : (
            <p className="placeholder">Solve the model to see its ground state here.</p>
          )}
          <MeanFieldCautions />
        </section>
      </main>
    </div>
  );
}
