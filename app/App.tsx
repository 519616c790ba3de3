import { useEffect } from 'react';
import { HistoryBar } from './history/HistoryBar';
import { Legend } from './map/Legend';
import { MapToolbar } from './map/MapToolbar';
import { MapView } from './map/MapView';
import { TermTip } from './notation/TermTip';
import { MeanFieldCautions } from './probe/MeanFieldCautions';
import { PinSummary } from './probe/PinSummary';
import { ProbePanel } from './probe/ProbePanel';
import { startProbeDriver } from './probe/probeDriver';
import { CutPanel } from './cut/CutPanel';
import { DrawingNote } from './cut/DrawingNote';
import { FigureBar } from './figure/FigureBar';
import { Readout } from './readout/Readout';
import { ObservationsPanel } from './observations/ObservationsPanel';
import { NoticeLine } from './scenario/NoticeLine';
import { ScenarioBar } from './scenario/ScenarioBar';
import { useScenarioSync } from './scenario/useScenarioSync';
import { SetupPanel } from './setup/SetupPanel';
import { MapStatus } from './status/MapStatus';

/**
 * The page. On a screen 1280 x 800 or larger the first band holds the Setup (scrolling on its
 * own, and staying in view), the Map (sized to the window's height, its status under it) and,
 * beside it, the state under the pointer with the selected pin's essentials; the Map's legend
 * and Figure follow under it, and the full Probe and the Cut come below the band.
 */
export function App() {
  useScenarioSync();
  useEffect(() => startProbeDriver(), []);
  return (
    <div className="page">
      <header className="masthead">
        <div className="title">
          <h1>Fourfold</h1>
          <p className="tagline" data-testid="tagline">
            Hartree-Fock ground states of graphene&rsquo;s zero-energy Landau level
          </p>
          <a
            className="notes-link"
            href="notes.html"
            target="_blank"
            rel="noopener"
            data-testid="notes-link"
          >
            Model notes
          </a>
        </div>
        <div className="masthead-tools">
          <HistoryBar />
          <ScenarioBar />
        </div>
      </header>
      <NoticeLine />
      <main className="workspace">
        <section className="panel setup-column" aria-labelledby="setup-heading">
          <h2 id="setup-heading">Setup</h2>
          <SetupPanel />
        </section>
        <section className="panel map-column" aria-labelledby="map-heading">
          <div className="panel-head">
            <h2 id="map-heading">Map</h2>
            <MapToolbar />
          </div>
          <MapView />
          <MapStatus />
          <DrawingNote />
          <Legend />
          <FigureBar />
        </section>
        <section className="panel readout-column" aria-labelledby="readout-heading">
          <PinSummary />
          <h2 id="readout-heading">State under the pointer</h2>
          <Readout />
          <MeanFieldCautions />
        </section>
        <section className="panel probe-row" aria-labelledby="probe-heading">
          <h2 id="probe-heading">Probe</h2>
          <ProbePanel />
        </section>
        <section className="panel cut-row" aria-labelledby="cut-heading">
          <h2 id="cut-heading">Cut</h2>
          <CutPanel />
        </section>
        <section className="panel observations-row" aria-labelledby="observations-heading">
          <h2 id="observations-heading">Observations</h2>
          <ObservationsPanel />
        </section>
      </main>
      <TermTip />
    </div>
  );
}
