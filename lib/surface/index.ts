// Surface wetting by test inks. Pure functions; errors are SurfaceInputError.
export {
  SurfaceInputError,
  evaluateWettingTension,
  roundToHalf,
  WETTING_SPREAD_WARNING_MNM,
  type WettingTensionResult,
} from "./wetting-tension";
