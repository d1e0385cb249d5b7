// Statistics for validation: attribute sample sizes, capability, individuals charts.
// Pure functions without I/O; each validates its input and throws StatsInputError.
export { StatsInputError } from "./errors";
export { D2_N2, D4_N2 } from "./constants";
export { successRunSampleSize } from "./sample-size";
export { capability, type CapabilityInput, type CapabilityResult } from "./capability";
export {
  individualsChart,
  RUN_LENGTH,
  type ControlRule,
  type IndividualsChart,
  type OutOfControlPoint,
} from "./control-chart";
