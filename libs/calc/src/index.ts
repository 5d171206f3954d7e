/** Public API of the calculation core. Import it only as `@gapwise/calc`. */
export * from './core/constants';
export * from './core/method';

// Dispatcher, registry and serialisation shared by the web pages, the API and the command line.
export { calculate, runMethod, serializeAnswer, canonicalInputs } from './core/calculate';
export type { Answer } from './core/calculate';
export type { MethodOutputs, TypedMethodId } from './method-outputs';
export { allMethods, findMethod, inputLabel, methodCatalog } from './core/registry';
export type { CatalogEntry, CatalogInput } from './core/registry';

// Units (the one units module) and strict input reading.
export {
  UNITS_BY_QUANTITY,
  allowedUnits,
  canonicalUnit,
  convertUnits,
  fromCanonical,
  isUnitFor,
  knownUnits,
  toCanonical,
  tryConvertUnits,
  unitDimension,
  UnitError,
  quantityPhrase,
  unrecognisedUnitMessage,
  differenceScale,
  photonEnergyEvFromNm,
  wavelengthNmFromEv,
} from './core/units';
// Reference electrodes: offsets with sources, for potentials typed against any of them.
export {
  FERROCENE_SOLVENTS,
  REFERENCE_ELECTRODES,
  REFERENCE_ELECTRODE_LABELS,
  convertPotential,
  isFerroceneSolvent,
  isReferenceElectrode,
  potentialScaleLabel,
  referenceOffsetVsShe,
  samePotentialScale,
} from './core/reference-electrodes';
export type {
  FerroceneSolvent,
  PotentialConversion,
  PotentialScale,
  ReferenceElectrode,
  ReferenceOffsetResult,
} from './core/reference-electrodes';
export type { ConversionResult } from './core/units';
export { RequestInputReader, WarningCollector, parseStrictNumber } from './core/inputs';
export { PLAUSIBLE_RANGES, WARNING_CODES, thermalEnergyEv } from './core/warnings';
export { logGamma } from './core/special/log-gamma';

// Kernels a web page may call directly (plots, screens).
export {
  LN_TWO_PI_OVER_HBAR,
  marcusActivationEv,
  marcusRate,
  marcusRateLog,
} from './rates/marcus/marcus';
export { mljMinimumTerms, mljRateLog } from './rates/mlj/mlj';
export type { MljSum } from './rates/mlj/mlj';
export {
  adiabaticityParameter,
  crossoverRateLog,
  solventControlledRateLog,
} from './rates/crossover/crossover';
export { rulerLog10Rate, rulerSlopePerAngstrom } from './rates/ruler/ruler';
export { crossRelationLnF, crossRelationRateLog } from './rates/cross-relation/cross-relation';
export { marcusRegime } from './rates/rate-inputs';
// Where a pair sits between the nonadiabatic and adiabatic limits (screens, reports, pair page).
export {
  DEFAULT_NUCLEAR_FREQUENCY_PER_S,
  adiabaticityMeasures,
  classifyAdiabaticity,
  landauZenerGamma,
} from './rates/coupling-regime';
export type { CouplingRegime } from './rates/coupling-regime';
export type { Regime } from './rates/rate-inputs';
export { marcusLog10kInto, mljLog10kInto } from './rates/vector';
export { marcusLog10kIntoArrays, mljLog10kIntoArrays } from './rates/vector-arrays';
export {
  bornSolventCorrectionEv,
  coulombWorkEv,
  ionPairCoulombTermEv,
  rehmWellerChargeRecombinationEv,
  rehmWellerChargeSeparationEv,
  wellerSolventCorrectionEv,
} from './driving-force/rehm-weller/rehm-weller';
export { pekarFactor, twoSphereLambdaEv } from './reorg/two-sphere/two-sphere';
export { fourPointLambdas } from './reorg/four-point/four-point';
export { gmhCouplingEv } from './coupling/gmh/gmh';
export { HUSH_CONSTANT, hushCouplingCm1, hushLimitWidthCm1 } from './coupling/hush/hush';
export { distanceDecayCouplingEv } from './coupling/distance-decay/distance-decay';
export { twoStateMixing } from './evb/two-state/two-state';
export type { TwoStateMixing } from './evb/two-state/two-state';
export { symmetricEigensystem } from './evb/multi-state/multi-state';
export type { Eigensystem } from './evb/multi-state/multi-state';

// Driving-force series fit and its confidence band (series page, API).
export { confidenceBandLog10k, fitDrivingForceSeries, modelLog10k } from './fit/index';
export type { ConfidenceBand, DrivingForceFit } from './fit/index';

// Energy-gap samples: the streaming pieces the server's trace analyses use (two passes over files).
export {
  GapSampleAccumulator,
  HistogramCounter,
  analyseGapSamples,
  gapOutputsFromCounts,
  mergeDiabaticCurves,
  planGapHistograms,
} from './gap/index';
export type {
  GapHistogramCounts,
  GapHistogramPlan,
  GapStateSummary,
  GapStatistics,
  MergedFreeEnergyCurve,
} from './gap/index';

// Electrode kinetics, hopping transport, quenching and sampling kernels a page may plot directly.
export { butlerVolmerRates, logMhcClosedForm, logMhcIntegral, mhcRates } from './electrode/index';
export type { MhcRates } from './electrode/index';
export { einsteinMobilityCm2PerVS, hoppingTransport } from './transport/index';
export { debyeFactor, diffusionQuenching, smoluchowskiRateM1S1 } from './quench/index';
export { SeededSampler } from './uncertainty/index';
export { freedmanDiaconisHistogram } from './gap/index';
