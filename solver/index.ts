export { CHANNELS, channelIndex, channelName, type Channel } from './channels';
export {
  ModelError,
  coulombScale,
  errorLine,
  isPlainObject,
  modelToJson,
  occupiedCount,
  parseModel,
  type ChannelCoupling,
  type Filling,
  type Model,
} from './model';
export {
  couplingArrays,
  couplingsFromArrays,
  couplingsOf,
  energyOfOrder,
  type CouplingArrays,
  type Couplings,
} from './couplings';
export {
  hermitianEigen4,
  multiplyFrame,
  orthonormaliseFrame,
  projectOut,
  symmetricEigen,
} from './linalg';
export { seededRandom, type RandomSource } from './random';
export { randomFrame } from './seeds';
export { orderOfProjector, projectorOf, hartreeFockOfOrder } from './state';
export { DEFAULT_DESCENT, descend, type DescentOptions, type DescentResult } from './localMinimise';
export {
  DescentWorkspace,
  frameEnergy,
  retract,
  tangentDimension,
  tangentModel,
} from './tangentSpace';
export {
  DEFAULT_MINIMISE,
  minimiseEnergy,
  type LocalMinimum,
  type MinimiseOptions,
  type MinimiseResult,
  type SearchPlan,
} from './minimise';
export {
  ORDER_GROUPS,
  groupMagnitudes,
  orderAngles,
  sublatticeSpins,
  type OrderGroup,
  type OrderGroupKey,
} from './orderParameters';
export { ORDER_TOLERANCE, TOKEN_MEANINGS, phaseLabel } from './phaseLabel';
export { modelSymmetry, type ModelSymmetry } from './symmetry';
export { canonicaliseOrbit } from './orbitGauge';
export { GOLDSTONE_TOLERANCE, collectiveModes, type CollectiveModes } from './collectiveModes';
export { occupiedSpinors } from './spinors';
export {
  brokenSymmetries,
  isSymmetry,
  orbitTangent,
  type BrokenSymmetries,
  type GaplessMode,
} from './goldstoneModes';
export {
  probeModel,
  probeOfResult,
  MAX_COMPETITORS,
  type BondOrder,
  type Competitor,
  type ProbeGaplessMode,
  type ProbeReport,
  type ProbeSpinor,
  type SiteOrder,
  type SpinSectorValley,
} from './probe';
export { describeState, solve, type SolveResult } from './groundState';
export { clean, solveResultToJson, type SolveJson } from './solveJson';
export { MEAN_FIELD_CAUTION, SOFTWARE_VERSION } from './version';
export {
  MAX_RESOLUTION,
  MAX_WHOLE_RESOLUTION,
  PlaneCouplings,
  axisValue,
  modelAtPoint,
  parseMapInput,
  parsePlane,
  planeTargets,
  wholeMapProblem,
  type Axis,
  type MapInput,
  type Plane,
  type PlaneTargets,
} from './plane';
export {
  COARSE_SEARCH,
  QUICK_SEARCH,
  PREVIEW_FRAMES,
  previewFrames,
  coarseLayout,
  coarseNodes,
  coarseStride,
  nodeRange,
  solveCoarseNodes,
  type CoarseBlock,
  type CoarseNodes,
} from './coarseNodes';
export {
  cellIsUniform,
  cellOf,
  cellSpan,
  solveCells,
  solvePixelList,
  solveRowsCold,
  type CellRange,
  type PixelBlock,
} from './pixelBlock';
export { PIXEL_EMPTY, PIXEL_PREVIEW, PIXEL_SOLVED, MapGrid, type PhaseMap } from './mapGrid';
export {
  BISECTION_TOLERANCE,
  FIRST_ORDER_JUMP,
  boundaryEdges,
  bisectTransition,
  locateTransitions,
  locateCrossings,
  type BracketEnd,
  type Crossing,
  type EdgeTransition,
  type LocatedTransition,
} from './crossings';
export {
  CUT_DISTANCE_LABEL,
  MAX_CUT_POINTS,
  checkCut,
  computeCut,
  type CutPath,
  type CutResult,
  type CutTransition,
} from './cut';
export { cutToCsv, cutToJson } from './cutExport';
export { csvComment, csvText } from './csvText';
export { joinBoundaries, type Boundary } from './boundaries';
export { computePhaseMap, localStages, splitRange, type MapStages } from './phaseMap';
export {
  MapRunStopped,
  cellRowCount,
  cellRowPixels,
  computeMapRows,
  seamEdges,
  shardCellRows,
  type EdgeRow,
  type MapRowBlock,
  type MapRowsOptions,
  type MapRowsResult,
} from './mapBands';
export {
  MAP_QUANTITIES,
  labelCounts,
  legendOf,
  legendOfCounts,
  mapCsvHead,
  mapCsvPieces,
  mapCsvRow,
  mapJsonEnding,
  mapJsonPieces,
  mapJsonProvenance,
  mapRowsCsvPieces,
  mapRowsJsonPieces,
  mapToCsv,
  mapToJson,
  phaseMapRows,
  type LegendEntry,
  type MapProvenance,
  type MapRows,
} from './mapExport';
export {
  MAP_PART_FORMAT,
  MAP_PART_KIND,
  PART_PIXELS_OPEN,
  partEndLines,
  partHeader,
  partRowLines,
  readPartCrossing,
  readPartHeader,
  readPartRow,
  readPartSeam,
  type PartHeader,
  type PartPlace,
} from './mapPart';
export {
  MAX_SERIES_VALUES,
  checkSeriesQuantity,
  parseSeriesQuantity,
  parseSeriesValues,
  seriesDocument,
  seriesProvenance,
  seriesQuantityLabel,
  seriesQuantityName,
  type SeriesQuantity,
} from './mapSeries';
export { textChunks } from './textChunks';
export { QUOTED_PATH_LENGTH, fieldKey, quoteInput } from './inputText';
export {
  BOHR_MAGNETON,
  ELEMENTARY_CHARGE,
  REDUCED_PLANCK,
  VACUUM_PERMITTIVITY,
  coulombScaleMeV,
  exchangeEnergyMeV,
  landauLevelMeV,
  landauLevelMixing,
  magneticLength,
  zeemanEnergyMeV,
} from './units';
export {
  RANGE_PROFILES,
  exchangeIntegral,
  exponentialIntegralE1,
  interactionOf,
  rangeCouplings,
  rangeCouplingsMeV,
  scaledExponentialIntegral,
  type RangeProfile,
} from './interactionRange';
export { scaledBesselI0 } from './besselI0';
export { coulombExchange, coulombExchangeLoss, imageExchange } from './coulombExchange';
export { channelChange, channelReading, type ChannelReading } from './channelWavevector';
export { eigenvaluesOfReal } from './realEigenvalues';
export { symplecticModes, type SymplecticModes } from './symplecticModes';
export { WavevectorHessian, channelVectors } from './wavevectorHessian';
export { ModeRotation } from './modeRotation';
export {
  FIT_WAVEVECTOR,
  modeDispersion,
  type DispersionOptions,
  type ModeDispersion,
} from './modeDispersion';
export {
  DEFAULT_WAVEVECTORS,
  MAX_WAVEVECTOR,
  MAX_WAVEVECTOR_COUNT,
  modelDispersion,
  wavevectorGrid,
  type ModelDispersion,
} from './modelDispersion';
export {
  DISPERSION_CAUTION,
  dispersionToCsv,
  dispersionToJson,
  type DispersionContext,
} from './dispersionExport';
// Observations and the fit (public/notes.html#observations, #fit).
export { readCsvRecords, type CsvRecord } from './csvRows';
export {
  CONDITION_PHRASES,
  conditionHolds,
  isPhaseLabel,
  parseStateCondition,
  type StateCondition,
} from './stateCondition';
export {
  MAX_OBSERVATIONS,
  OBSERVATION_COLUMNS,
  OBSERVATION_KINDS,
  PAIR_COLUMN,
  observationCells,
  observationFromCells,
  observationsFromJson,
  observationsToCsv,
  observationsToJson,
  parseObservationsCsv,
  type Observation,
  type ObservationCells,
  type ObservationColumn,
  type ObservationKind,
} from './observations';
export {
  MAX_SWEEP_TILT,
  RATIO_CHANNELS,
  conditionDocument,
  conditionKey,
  fieldConditionOf,
  hartreeRatioOf,
  parseFitPlane,
  sweepConditionOf,
  valleyPerTesla,
  withHartreeRatio,
  zeemanPerTesla,
  type FieldCondition,
  type FitPlane,
  type FreeRatio,
  type TiltSweepCondition,
} from './fitPlane';
export { SWEEP_SAMPLES, predictedTilt, tiltResidual, tiltSweep, type TiltSweep } from './tiltSweep';
export {
  DEFAULT_FIT_OPTIONS,
  chiSquare,
  phasesHold,
  predictRows,
  rowInGrid,
  rowInLikelihood,
  type FitOptions,
  type FitProblem,
  type RowPrediction,
} from './rowPredictions';
export {
  FitCancelled,
  computeConditionMap,
  type ConditionMap,
  type ConditionStages,
} from './conditionMap';
export {
  DEFAULT_SWEEP_FIELD,
  REFINE_TOLERANCE,
  computeSweepField,
  type SweepField,
  type SweepFieldOptions,
} from './sweepField';
export { consistencyGrid, type ConsistencyGrid } from './consistencyGrid';
export { TWO_SIGMA_LEVEL, chiSquareRise, erf } from './chiSquareLevels';
export {
  RATIO_BOUNDS,
  fitLikelihood,
  type FitParameter,
  type FitResult,
  type RowEvaluator,
} from './likelihoodFit';
export { runFit, type FitOutcome, type FitProgress, type FitRunners } from './fitRun';
export { localConditionStages, localFitRunners, rowsAt, sweepsAt } from './fitStages';
export { fitCaution, fitToJson } from './fitJson';
export { predictTilts, type TiltPrediction } from './tiltPrediction';
export {
  fitOptionsFromJson,
  observationSetOfDocument,
  observationSetToJson,
  type ObservationSet,
} from './observationSet';
