import { useEffect } from 'react';
import { ModelError, errorLine } from '../../solver/index';
import { nameNextStep } from '../history/historyDriver';
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
 * sessionStorage key (this tab only) of the tab's own addresses: the latest, which the setup
 * stands for, and digests of the addresses the tab showed lately. A reload right after an edit
 * may start from one of the tab's older addresses (the address is written a moment later, and
 * the browser learns of a write a moment after the page makes it); the tab's latest then wins.
 * Any other link wins.
 */
export const TAB_ADDRESSES_KEY = 'fourfold.address.tab';

/** Digests of the tab's addresses kept (the writes of the last few seconds at most). */
const ADDRESSES_KEPT = 32;

interface TabAddresses {
  readonly latest: string;
  readonly shown: readonly string[];
}

/** 32-bit FNV-1a digest of a text, in hex (Fowler-Noll-Vo, a public-domain hash). */
function digest(text: string): string {
  let h = 0x811c9dc5;
  for (let k = 0; k < text.length; k++) {
    h ^= text.charCodeAt(k);
    h = Math.imul(h, 0x01000193);
  }
  return (h >>> 0).toString(16);
}

function readTabAddresses(): TabAddresses | null {
  try {
    const text = sessionStorage.getItem(TAB_ADDRESSES_KEY);
    const json = (text === null ? null : JSON.parse(text)) as Partial<TabAddresses> | null;
    return json && typeof json.latest === 'string' && Array.isArray(json.shown)
      ? { latest: json.latest, shown: json.shown.filter((d) => typeof d === 'string') }
      : null;
  } catch {
    return null;
  }
}

function writeTabAddresses(addresses: TabAddresses): void {
  try {
    sessionStorage.setItem(TAB_ADDRESSES_KEY, JSON.stringify(addresses));
  } catch {
    // Session storage off: a reload right after an edit may then start from the older address.
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
 * ADDRESS_WRITE_INTERVAL_MS of the last write, as soon as that time is up; the tab keeps the
 * address it stands for in sessionStorage at once (TAB_ADDRESSES_KEY), so a reload or a crash
 * right after an edit keeps the edit. A hash edited by hand, or a pasted link in the same tab,
 * is read again.
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

    // The tab's own addresses: the one it was opened on and every one it wrote since.
    let shown: string[] = [];
    const remember = (latest: string, address: string | null) => {
      if (address !== null && shown[shown.length - 1] !== digest(address)) {
        shown = [...shown, digest(address)].slice(-ADDRESSES_KEPT);
      }
      writeTabAddresses({ latest, shown });
    };

    const writeAddress = () => {
      clearTimeout(timer);
      timer = undefined;
      const hash = latestHash();
      lastWrite = performance.now();
      written = hash;
      replaceAddress(hash);
      remember(hash, hash);
    };

    const onChange = () => {
      const wait = lastWrite + ADDRESS_WRITE_INTERVAL_MS - performance.now();
      if (wait <= 0 && timer === undefined) {
        writeAddress();
        return;
      }
      remember(latestHash(), null);
      if (timer === undefined) timer = setTimeout(writeAddress, Math.max(0, wait));
    };

    /** Shows a notice; at start it joins one already there (from the autosave) on its line. */
    const notify = (notice: Notice, atStart: boolean) => {
      const prior = atStart ? store.getState().view.notice : null;
      // (A second start, as React's development mode makes, says nothing new.)
      if (prior?.text.endsWith(notice.text)) return;
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
        nameNextStep({ label: 'Setup from the link', kind: 'link' });
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
      // One of this tab's own addresses (a reload right after an edit): its latest wins.
      const own = readTabAddresses();
      if (own !== null && own.shown.includes(digest(window.location.hash))) {
        shown = [...own.shown];
        replaceAddress(own.latest);
      }
      remember(window.location.hash, window.location.hash);
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
      remember(window.location.hash, window.location.hash);
      applyHash(false);
    };
    // A write still waiting is made before the page is hidden or goes away (for the history
    // entry and a restored session; a reload already asked for may keep the older address,
    // which the tab's addresses cover).
    const flush = () => {
      if (timer !== undefined) writeAddress();
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
