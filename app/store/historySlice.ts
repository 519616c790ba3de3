import type { StateCreator } from 'zustand';
import { startHistory, type SetupHistory } from '../history/setupHistory';
import { DEMO_SETUP } from '../scenario/demo';
import type { FourfoldState } from './index';

export interface HistorySlice {
  /** The steps of setup and plane changes (undo, redo, the history list). */
  readonly history: SetupHistory;
  setHistory(history: SetupHistory): void;
}

export const createHistorySlice: StateCreator<FourfoldState, [], [], HistorySlice> = (set) => ({
  history: startHistory(DEMO_SETUP),
  setHistory: (history) => set({ history }),
});
