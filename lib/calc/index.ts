// Reference: docs/calculations.md (all sections).
/**
 * Fuelwright's calculation library: pure functions, no I/O. The browser, the server actions,
 * the PDF renderer and the JSON API all call this one implementation.
 */
export { CalcInputError } from "./_lib/input-error";
export * from "./constants";
export {
  fuelBlend,
  stoichAfrFromComposition,
  afrFromLambda,
  lambdaFromAfr,
  ETHANOL,
  METHANOL,
  E85_STANDARD_RANGES,
  DEFAULT_E85_RANGE,
} from "./fuel";
export type { Composition, FuelBlend, FuelProperties } from "./fuel";
export {
  mixFuels,
  volumeToAdd,
  fillSplit,
  ethanolFromFlexSensorHz,
  flexSensorHzFromEthanol,
  FLEX_SENSOR_HZ,
  FLEX_SENSOR_MIN_SPAN_PCT,
  flexSensorAdvice,
} from "./blend";
export type { FlexSensorAdvice } from "./blend";
export type {
  FuelVolume,
  VolumeToAddQuery,
  VolumeToAddResult,
  FillSplitQuery,
  FillSplitResult,
} from "./blend";
export {
  crankPowerFromWheel,
  wheelPowerFromCrank,
  fuelMassFlowGPerMin,
  fuelVolumeFlowLPerH,
  bsfcAtBlend,
  defaultBsfc,
  DEFAULT_BSFC,
  G_PER_KWH_PER_LB_PER_HP_H,
} from "./power";
export type { Aspiration, BsfcDefaults, BsfcEstimate } from "./power";
export {
  injectorFlowAtPressure,
  injectorFlowForFuel,
  injectorDifferentialPressureKpa,
  railPressureKpa,
  injectorDutyPct,
  requiredInjectorFlowCcPerMin,
  injectorPowerCeilingKw,
  dutyBand,
  effectivePulseWidthMs,
  pulseWidthForFuelMs,
  idleFuelConsumptionLPerH,
  cycleTimeMs,
  deadTimeMs,
  idleFuelPerCylinderMg,
  gaugeFromAbsKpa,
} from "./injectors";
export type { RegulatorType, RegulatorQuery, DeadTimeTable, DutyBand } from "./injectors";
export { MAX_RISING_RATE_RATIO } from "./injectors";
export { fuelPressureAgainstBoost, regulatorBypassCapacityLPerH } from "./regulator";
export { demandAtBoostLPerH, supplyAgainstBoost } from "./staging";
export type { SupplyPoint } from "./staging";
export type { BoostPressurePoint } from "./regulator";
export {
  pumpFlowLPerH,
  pumpsSupplyLPerH,
  pumpSupplyFunction,
  pumpMarginPct,
  pumpPowerCeilingKw,
  validatePumpCurve,
} from "./pumps";
export type { Pump, PumpCurve, PumpFlow } from "./pumps";
export {
  linePressureDrop,
  frictionFactor,
  laminarFrictionFactor,
  swameeJainFrictionFactor,
  colebrookFrictionFactor,
  AN_SIZES,
  anTubeOdMm,
  DEFAULT_HOSE_ROUGHNESS_MM,
} from "./lines";
export type { LineSegment, LineDrop } from "./lines";
export {
  awgDiameterMm,
  copperResistanceOhmPerM,
  wireVoltageDropV,
  voltageAfterWiringV,
} from "./wire";
export * from "./units";
export * from "./number-text";
export * from "./schema";
export {
  sizeFuelSystem,
  sizeParsedFuelSystem,
  CALC_VERSION,
  DEFAULT_LIMITS,
  DEFAULT_DRIVETRAIN_LOSS_PCT,
} from "./size";
export type { SizingLimits } from "./size";
export { PRE_PUMP_FILTER_CAUTION_KPA } from "./sizing/warnings-stage";
export type { FuelSystemResult, BlendEnd, PulseWidth, LineResult } from "./size";
export {
  dutyAcrossRpm,
  dutyAcrossEthanol,
  pumpSupplyCurve,
  sizingAnswer,
  niceTicks,
  fuelPressureChart,
  pumpBoostChart,
} from "./charts";
export type { BoostChart, ChartAxis } from "./charts";
export type { TraceStep, Warning, Severity } from "./types";
export * from "./quantities";
export * from "./registry";
export * from "./messages";
export * from "./issue-messages";
export * from "./input-bounds";
export { parseDatalog, datalogDelimiter, DatalogError, DATALOG_MAX_COLUMNS } from "./datalog";
export type { Datalog } from "./datalog";
export { analyzePull, sampleDutyPct, flowFromDuty } from "./dyno";
export type { PullSample, PullContext, PullAnalysis } from "./dyno";
export {
  DatalogMappingSchema,
  MAX_EGT_COLUMNS,
  headerKey,
  EXHAUST_MIN_ABSOLUTE_KPA,
  mappingProblems,
  pressureReference,
  samplesFromLog,
  suggestMapping,
} from "./log-mapping";
export { pressureReadingNotes } from "./tune-pressure";
export type { DatalogMapping } from "./log-mapping";
export {
  shopBsfcTable,
  shopBsfcFor,
  fuelClassOf,
  aspirationClassOf,
  FUEL_CLASS_LABELS,
  ASPIRATION_CLASS_LABELS,
  MEASURED_BSFC_RANGE,
} from "./shop-bsfc";
export type { BsfcPoint, ShopBsfcRow, FuelClass, AspirationClass } from "./shop-bsfc";
export {
  BACK_PRESSURE_MIN_BOOST_KPA,
  backPressurePoints,
  checkLimits,
  crankPowerKw,
  DEFAULT_TUNE_LIMITS,
  LambdaTargetSchema,
  lambdaTargetAt,
  LIMIT_KEYS,
  LIMIT_LABELS,
  MAX_PULL_POINTS,
  POWER_MEASURED_AT,
  powerAtBoostKw,
  predictNextStep,
  preparePull,
  mergeTuneLimits,
  nextOverride,
  sameLimit,
  summarizePull,
  TUNE_LIMIT_KEYS,
  TuneLimitsOverrideSchema,
  TuneLimitsSchema,
} from "./tune";
export type {
  LimitCheck,
  LimitKey,
  LimitStatus,
  NextStep,
  PowerMeasuredAt,
  StepTarget,
  TuneLimitKey,
  TuneLimits,
  TuneLimitsOverride,
  TunePoint,
  TunePullSummary,
} from "./tune";
