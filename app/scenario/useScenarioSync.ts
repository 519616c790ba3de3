import { useEffect } from 'react';
import { ModelError, errorLine } from '../../solver/index';
import { useFourfold } from '../store/index';
import type { Pin } from '../store/probeSlice';
import type { ViewSlice } from '../store/viewSlice';
import { setupToScenario } from './scenario';
import type { Setup } from './setup';
import { readScenarioLink, scenarioHash } from './urlState';

/**
 * Fewest milliseconds between two writes of the address. Browsers limit how often a page may
 * call history.replaceState (Chromium and Firefox allow about 200 calls in 10 s, from memory),
 * so a slider drag writes at most every this many milliseconds, not on every input event.
 */
export const ADDRESS_WRITE_INTERVAL_MS = 100;

/**
 * sessionStorage key (this tab only) of an address write that is still waiting: the address
 * shown and the one the setup stands for. A reload in the meantime starts from the latter, so
 * an edit is never rolled back by the older address.
 */
export const PENDING_ADDRESS_KEY = 'fourfold.address.pending';

interface PendingAddress {
  readonly shown: string;
  readonly latest: string;
}

function readPending(): PendingAddress | null {
  try {
    const text = sessionStorage.getItem(PENDING_ADDRESS_KEY);
    const json: unknown = text === null ? null : JSON.parse(text);
    const p = json as Partial<PendingAddress> | null;
    return p && typeof p.shown === 'string' && typeof p.latest === 'string'
      ? { shown: p.shown, latest: p.latest }
      : null;
  } catch {
    return null;
  }
}

function writePending(pending: PendingAddress | null): void {
  try {
    if (pending === null) sessionStorage.removeItem(PENDING_ADDRESS_KEY);
    else sessionStorage.setItem(PENDING_ADDRESS_KEY, JSON.stringify(pending));
  } catch {
    // Session storage off: the address still catches up within ADDRESS_WRITE_INTERVAL_MS.
  }
}

function replaceAddress(hash: string): void {
  if (hash === window.location.hash) return;
  const { pathname, search } = window.location;
  window.history.replaceState(window.history.state, '', `${pathname}${search}${hash}`);
}

function sameScenario(a: Setup, b: Setup): boolean {
  return JSON.stringify(setupToScenario(a)) === JSON.stringify(setupToScenario(b));
}

function samePins(a: readonly Pin[], b: readonly Pin[]): boolean {
  return a.length === b.length && a.every((p, k) => p.x === b[k]!.x && p.y === b[k]!.y);
}

type Notice = NonNullable<ViewSlice['view']['notice']>;

/**
 * Keeps the setup (and the Probe pins) and the address in step; mount once, in App. On start a
 * scenario in the hash (`#s=`) replaces the autosaved setup (a valid link wins); a malformed
 * one is reported as an error notice and changes nothing. Afterwards every change is written
 * to the hash with `history.replaceState` (no history entries) at once, or, within
 * ADDRESS_WRITE_INTERVAL_MS of the last write, as soon as that time is up; meanwhile the tab
 * keeps the address it stands for in sessionStorage, so a reload or a crash right after an
 * edit keeps the edit. A hash edited by hand, or a pasted link in the same tab, is read again.
 */
export function useScenarioSync(): void {
  useEffect(() => {
    const store = useFourfold;
    let timer: ReturnType<typeof setTimeout> | undefined;
    let lastWrite = Number.NEGATIVE_INFINITY;
    let written: string | null = null;

    const latestHash = () => {
      const { setup, probe } = store.getState();
      return scenarioHash(setup, window.location.hash, probe.pins);
    };

    /**
     * Writes the address. `settled` false (the page is going away) keeps the pending note: a
     * reload reads the address it had when it was asked for, before this write.
     */
    const writeAddress = (settled = true) => {
      clearTimeout(timer);
      timer = undefined;
      const hash = latestHash();
      lastWrite = performance.now();
      written = hash;
      replaceAddress(hash);
      if (settled) writePending(null);
    };

    const onChange = () => {
      const wait = lastWrite + ADDRESS_WRITE_INTERVAL_MS - performance.now();
      if (wait <= 0 && timer === undefined) {
        writeAddress();
        return;
      }
      writePending({ shown: window.location.hash, latest: latestHash() });
      if (timer === undefined) timer = setTimeout(() => writeAddress(), Math.max(0, wait));
    };

    /** Shows a notice; at start it joins one already there (from the autosave) on its line. */
    const notify = (notice: Notice, atStart: boolean) => {
      const prior = atStart ? store.getState().view.notice : null;
      store.getState().setNotice(
        prior === null
          ? notice
          : {
              kind: prior.kind === 'error' ? 'error' : notice.kind,
              text: `${prior.text} ${notice.text}`,
            },
      );
    };

    /** Applies the hash's scenario; false when the hash holds a malformed one. */
    const applyHash = (atStart: boolean): boolean => {
      let link: ReturnType<typeof readScenarioLink>;
      try {
        link = readScenarioLink(window.location.hash);
      } catch (error) {
        const text = error instanceof ModelError ? error.message : errorLine(error);
        notify({ kind: 'error', text: `${text}. The setup is unchanged.` }, atStart);
        return false;
      }
      if (link === null) return true;
      // A reload shows the same setup in the hash and the autosave: keep it (and its Map).
      if (!sameScenario(link.setup, store.getState().setup)) {
        store.getState().replaceSetup(link.setup);
      }
      // Pins of the link (a reload shows the autosaved ones again: keep those and their Probes).
      if (link.pins !== null && !samePins(link.pins, store.getState().probe.pins)) {
        store.getState().replacePins(link.pins);
      }
      if (link.note !== null) {
        notify({ kind: 'info', text: `Setup from the link: ${link.note}.` }, atStart);
      }
      return true;
    };

    const start = () => {
      // A reload before the address caught up shows the older address: this tab's latest wins.
      const pending = readPending();
      writePending(null);
      if (pending !== null && pending.shown === window.location.hash)
        replaceAddress(pending.latest);
      if (applyHash(true)) writeAddress();
    };

    let stopHydrationWait: (() => void) | undefined;
    if (store.persist.hasHydrated()) start();
    else stopHydrationWait = store.persist.onFinishHydration(start);

    const stopSubscription = store.subscribe((state, previous) => {
      if (state.setup === previous.setup && state.probe.pins === previous.probe.pins) return;
      onChange();
    });

    const onHashChange = () => {
      if (window.location.hash === written) return;
      // A link pasted into the address bar: it wins over a write still waiting.
      clearTimeout(timer);
      timer = undefined;
      writePending(null);
      applyHash(false);
    };
    // A write still waiting is made before the page is hidden or goes away (for the history
    // entry and a restored session; a reload already asked for keeps the older address, which
    // the pending note covers).
    const flush = () => {
      if (timer !== undefined) writeAddress(false);
    };
    const onVisibility = () => {
      if (document.visibilityState === 'hidden') flush();
    };
    window.addEventListener('hashchange', onHashChange);
    window.addEventListener('pagehide', flush);
    document.addEventListener('visibilitychange', onVisibility);

    return () => {
      clearTimeout(timer);
      stopHydrationWait?.();
      stopSubscription();
      window.removeEventListener('hashchange', onHashChange);
      window.removeEventListener('pagehide', flush);
      document.removeEventListener('visibilitychange', onVisibility);
    };
  }, []);
}
