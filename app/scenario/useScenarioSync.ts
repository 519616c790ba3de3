import { useEffect } from 'react';
import { ModelError, errorLine } from '../../solver/index';
import { useFourfold } from '../store/index';
import type { Pin } from '../store/probeSlice';
import { setupToScenario } from './scenario';
import { fitSetupToApp } from './setupCheck';
import type { Setup } from './setup';
import { readScenarioLink, scenarioHash } from './urlState';

/** Quiet time after the last setup change before the address is rewritten, ms. */
export const HASH_WRITE_DELAY_MS = 250;

function sameScenario(a: Setup, b: Setup): boolean {
  return JSON.stringify(setupToScenario(a)) === JSON.stringify(setupToScenario(b));
}

function samePins(a: readonly Pin[], b: readonly Pin[]): boolean {
  return a.length === b.length && a.every((p, k) => p.x === b[k]!.x && p.y === b[k]!.y);
}

/**
 * Keeps the setup (and the Probe pins) and the address in step; mount once, in App. On start a scenario in the hash
 * (`#s=`) replaces the autosaved setup (a shared link wins); a malformed one is reported as an
 * error notice and changes nothing. Afterwards every setup change is written back to the hash
 * with `history.replaceState` (no history entries), debounced. A hash edited by hand, or a
 * pasted link in the same tab, is read again.
 */
export function useScenarioSync(): void {
  useEffect(() => {
    const store = useFourfold;
    let timer: ReturnType<typeof setTimeout> | undefined;
    let written: string | null = null;

    const writeHash = () => {
      timer = undefined;
      const { setup, probe } = store.getState();
      const hash = scenarioHash(setup, window.location.hash, probe.pins);
      written = hash;
      if (hash === window.location.hash) return;
      const { pathname, search } = window.location;
      window.history.replaceState(window.history.state, '', `${pathname}${search}${hash}`);
    };

    /** Applies the hash's scenario; false when the hash holds a malformed one. */
    const applyHash = (): boolean => {
      let link: ReturnType<typeof readScenarioLink>;
      try {
        link = readScenarioLink(window.location.hash);
      } catch (error) {
        const text = error instanceof ModelError ? error.message : errorLine(error);
        store.getState().setNotice({ kind: 'error', text: `${text}. The setup is unchanged.` });
        return false;
      }
      if (link === null) return true;
      const fitted = fitSetupToApp(link.setup);
      // A reload shows the same setup in the hash and the autosave: keep it (and its Map).
      if (!sameScenario(fitted.setup, store.getState().setup)) {
        store.getState().replaceSetup(fitted.setup);
      }
      // Pins of the link (a reload shows the autosaved ones again: keep those and their Probes).
      if (link.pins !== null && !samePins(link.pins, store.getState().probe.pins)) {
        store.getState().replacePins(link.pins);
      }
      if (fitted.note !== null) {
        store.getState().setNotice({ kind: 'info', text: `Setup from the link: ${fitted.note}.` });
      }
      return true;
    };

    const start = () => {
      if (applyHash()) writeHash();
    };

    let stopHydrationWait: (() => void) | undefined;
    if (store.persist.hasHydrated()) start();
    else stopHydrationWait = store.persist.onFinishHydration(start);

    const stopSubscription = store.subscribe((state, previous) => {
      if (state.setup === previous.setup && state.probe.pins === previous.probe.pins) return;
      clearTimeout(timer);
      // Slider drags are debounced; a pin (a click) is written at once, so that a reload right
      // after it does not read a link that still has the old pins.
      if (state.setup === previous.setup) writeHash();
      else timer = setTimeout(writeHash, HASH_WRITE_DELAY_MS);
    });

    const onHashChange = () => {
      if (window.location.hash !== written) applyHash();
    };
    // A change still waiting for its debounce is written before the page goes away.
    const onPageHide = () => {
      if (timer !== undefined) {
        clearTimeout(timer);
        writeHash();
      }
    };
    window.addEventListener('hashchange', onHashChange);
    window.addEventListener('pagehide', onPageHide);

    return () => {
      clearTimeout(timer);
      stopHydrationWait?.();
      stopSubscription();
      window.removeEventListener('hashchange', onHashChange);
      window.removeEventListener('pagehide', onPageHide);
    };
  }, []);
}
