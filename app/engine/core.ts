/**
 * The roof engine without its fall unit reader (mathjs), for the sandbox's worker, which loads the
 * reader only when a fall needs it (`needsFallUnits`, `loadFallUnits`). Everywhere else imports
 * `~/engine`, which is this with the reader installed (docs/decisions/0015-lazy-unit-reader.md).
 */
export {
  analyse,
  analyseRoof,
  type AnalyseOptions,
  MAX_MESH_VERTICES,
  meshStationEstimate,
  PREVIEW_MESH_VERTICES,
} from "./analyse";
export { parseSpec, parseRoofSpec, type ParseSpecResult, type ParseRoofResult } from "./parse-spec";
export type { Roof } from "./roof";
export { drainName, outletName } from "./names";
export { pointsSignedArea } from "./geometry/area";
export {
  parseFall,
  formatRatio,
  fallFromRatio,
  fallFromSlope,
  fallNeedsUnitReader,
  type Fall,
  type FallResult,
} from "./fall";
export { loadFallUnits, needsFallUnits } from "./fall-loader";
export {
  RULE_SETS,
  RULE_SET_IDS,
  DEFAULT_RULE_SET,
  ruleValue,
  type RuleSet,
  type RuleSetId,
  type RuleValues,
  type CitedValue,
  type UsedRule,
  type Confidence,
} from "./rule-sets";
export { LIMITS, DEFAULTS } from "./prepare";
export { DEFAULT_BAND_EDGES } from "./fall-map";
export { designFlow, designFlowGpm, outletCapacity } from "./hydraulics";
export type {
  RoofSpec,
  Analysis,
  Point,
  EdgeKind,
  Warning,
  WarningFix,
  JoistDirectionOption,
  EdgeFall,
  Joist,
  JoistSpan,
  FallLine,
  OutletJoist,
  JoistSetOut,
  Band,
  Catchment,
  Mesh,
  MeshBuffers,
  FlowTraces,
} from "./types";
export {
  asBuilt,
  designLevelAt,
  AS_BUILT_DEFAULTS,
  AS_BUILT_LIMITS,
  type AsBuiltAnswer,
  type AsBuiltResult,
  type AsBuiltFailure,
  type Deviation,
  type JoistFix,
  type Pond,
  type SurveyPoint,
  type Tolerance,
} from "./as-built";
