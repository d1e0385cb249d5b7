// Technical cleanliness computations (ISO 16232:2018, VDA 19.1:2015) and fluid cleanliness codes
// (ISO 4406). Pure functions without I/O; each validates its input and throws CleanlinessInputError.
export { CleanlinessInputError, CleanlinessSpecError } from "./errors";
export {
  SIZE_CLASSES,
  SIZE_CLASS_KEYS,
  sizeClassOf,
  isSizeClassKey,
  type SizeClass,
  type SizeClassKey,
  type ParticleCounts,
} from "./size-classes";
export {
  CLEANLINESS_LEVELS,
  ABOVE_LAST_LEVEL,
  cleanlinessLevel,
  levelUpperBound,
  type CleanlinessLevel,
} from "./levels";
export {
  BASIS_PREFIX,
  BASIS_UNIT,
  normalizeCount,
  denormalizeCount,
  type Basis,
  type BasisKind,
} from "./basis";
export { cleanlinessCode, type CleanlinessCodeOptions } from "./code";
export {
  parseCleanlinessSpec,
  evaluateAgainstSpec,
  type CleanlinessSpec,
  type SpecGroup,
  type SpecRow,
  type SpecEvaluation,
} from "./spec";
export {
  evaluateExtraction,
  DEFAULT_EXTRACTION_MAX_RATIO,
  DEFAULT_MAX_EXTRACTIONS,
  type ExtractionOptions,
  type ExtractionResult,
  type ExtractionStatus,
} from "./extraction";
export {
  evaluateBlank,
  DEFAULT_BLANK_MAX_FRACTION,
  type BlankOptions,
  type BlankRow,
  type BlankEvaluation,
} from "./blank";
export {
  gravimetricResidue,
  GRAVIMETRY_PRACTICAL_LIMIT_MG,
  GRAVIMETRY_BLANK_MAX_FRACTION,
  type GravimetryInput,
  type GravimetryResult,
} from "./gravimetry";
export {
  ISO4406_MIN_COUNTED,
  ISO4406_SCALE,
  iso4406ScaleNumber,
  iso4406Code,
  iso4406CodeMarked,
  type Iso4406Scale,
} from "./iso4406";
