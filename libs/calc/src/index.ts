/** Public API of the calculation core. Import it only as `@gapwise/calc`. */
export * from './core/constants';
export * from './core/method';

// Dispatcher, registry and serialisation shared by the web pages, the API and the command line.
export { calculate, serializeAnswer } from './methods/calculate';
export type { Answer } from './methods/calculate';
export type { MethodOutputs, TypedMethodId } from './methods/method-outputs';
// The output type of every method (what `calculate` answers for its id).
export type { TemperatureOutputs } from './analysis/temperature/temperature';
export type { ReferenceOutputs } from './driving-force/reference/reference';
export type { MhcAbsoluteOutputs } from './electrode/mhc-absolute/mhc-absolute';
export type { AdiabaticBarrierOutputs } from './evb/adiabatic-barrier/adiabatic-barrier';
export type { SternVolmerOutputs } from './quench/stern-volmer/stern-volmer';
export type { CrossRelationWorkOutputs } from './rates/cross-relation-work/cross-relation-work';
export type { LandauZenerOutputs } from './rates/landau-zener/landau-zener';
export type { MljThermalOutputs } from './rates/mlj-thermal/mlj-thermal';
export type { NormalModesOutputs } from './reorg/normal-modes/normal-modes';
export type { DistanceDecayOutputs } from './coupling/distance-decay/distance-decay';
export type { GmhOutputs } from './coupling/gmh/gmh';
export type { HushOutputs } from './coupling/hush/hush';
export type { RehmWellerOutputs } from './driving-force/rehm-weller/rehm-weller';
export type { ButlerVolmerOutputs } from './electrode/butler-volmer/butler-volmer';
export type { MhcOutputs } from './electrode/mhc/mhc';
export type { MultiStateOutputs } from './evb/multi-state/multi-state';
export type { TwoStateOutputs } from './evb/two-state/two-state';
export type { DrivingForceSeriesOutputs } from './fit/driving-force-series/driving-force-series';
export type { ElectrodeKineticsFitOutputs } from './fit/electrode-kinetics/electrode-kinetics';
export type { GapSamplesOutputs } from './gap/gap-samples/gap-samples';
export type { DiffusionOutputs } from './quench/diffusion/diffusion';
export type { CrossRelationOutputs } from './rates/cross-relation/cross-relation';
export type { CrossoverOutputs } from './rates/crossover/crossover';
export type { MarcusOutputs } from './rates/marcus/marcus';
export type { MljOutputs } from './rates/mlj/mlj';
export type { RulerOutputs } from './rates/ruler/ruler';
export type { FourPointOutputs } from './reorg/four-point/four-point';
export type { TwoSphereOutputs } from './reorg/two-sphere/two-sphere';
export type { HoppingOutputs } from './transport/hopping/hopping';
export type { MonteCarloOutputs } from './uncertainty/monte-carlo/monte-carlo';
export type { ConvertOutputs } from './units/convert/convert';
export { allMethods, findMethod, inputLabel, methodCatalog } from './methods/registry';
export type { CatalogEntry, CatalogInput } from './methods/registry';

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
export { LN_TWO_PI_OVER_HBAR, marcusActivationEv, marcusRateLog } from './rates/marcus/marcus';
export { mljMinimumTerms, mljRateLog } from './rates/mlj/mlj';
export type { MljSum } from './rates/mlj/mlj';
export { adiabaticityParameter, solventControlledRateLog } from './rates/crossover/crossover';
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
// Electrode-kinetics fit (electrode page, API).
export { butlerVolmerLog10k, fitElectrodeKinetics, mhcLog10k } from './fit/index';
export type { ElectrodeFit, ElectrodeModelFit, ElectrodePoint } from './fit/index';

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
  GapOutputs,
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
