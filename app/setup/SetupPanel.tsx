import { useCallback, useRef } from 'react';
import { useFourfold } from '../store/index';
import { ChannelTable } from './ChannelTable';
import { CommonCouplings } from './CommonCouplings';
import { FieldSliders } from './FieldSlider';
import { FillingField } from './FillingField';
import { LoadedTerms } from './LoadedTerms';
import { PlaneFields } from './PlaneFields';
import { ProblemReport } from './problemReport';
import { RangeFields } from './RangeFields';
import { UnitsFields } from './UnitsFields';
import './setup.css';

/**
 * The Setup: filling, fields, couplings and the plane of the Map. Every entry is checked before
 * it reaches the store; refused entries are flagged beside their field, and the first of them
 * is published as the store's `setupProblem` while the last valid Map stays.
 */
export function SetupPanel() {
  const setSetupProblem = useFourfold((s) => s.setSetupProblem);
  const problems = useRef(new Map<string, string>());
  const report = useCallback(
    (key: string, message: string | null) => {
      if (message === null) problems.current.delete(key);
      else problems.current.set(key, message);
      const first = problems.current.values().next();
      const problem = first.done ? null : first.value;
      if (useFourfold.getState().view.setupProblem !== problem) setSetupProblem(problem);
    },
    [setSetupProblem],
  );
  return (
    <ProblemReport.Provider value={report}>
      <form
        className="setup-panel"
        aria-label="Setup"
        noValidate
        onSubmit={(event) => event.preventDefault()}
      >
        <FillingField />
        <UnitsFields />
        <FieldSliders />
        <CommonCouplings />
        <RangeFields />
        <ChannelTable />
        <LoadedTerms />
        <PlaneFields />
      </form>
    </ProblemReport.Provider>
  );
}
