import { createContext } from 'react';

/**
 * How a Setup field reports that its entry is refused (message naming the field) or fine again
 * (null). The panel gathers these into the store's `setupProblem`.
 */
export type ReportProblem = (key: string, message: string | null) => void;

export const ProblemReport = createContext<ReportProblem>(() => {});
