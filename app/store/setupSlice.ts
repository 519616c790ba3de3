import type { StateCreator } from 'zustand';
import { DEMO_SETUP } from '../scenario/demo';
import type { Setup } from '../scenario/setup';
import type { FourfoldState } from './index';

export interface SetupSlice {
  readonly setup: Setup;
  /** Replaces parts of the setup; callers pass only values they have validated. */
  updateSetup(patch: Partial<Setup>): void;
  /** Replaces the whole setup (scenario load, demo reset). */
  replaceSetup(setup: Setup): void;
}

export const createSetupSlice: StateCreator<FourfoldState, [], [], SetupSlice> = (set) => ({
  setup: DEMO_SETUP,
  updateSetup: (patch) => set((s) => ({ setup: { ...s.setup, ...patch } })),
  replaceSetup: (setup) => set({ setup }),
});
