/** Closed sets of values, shared by the schema, zod schemas and client components. */

export const ROLES = [
  "admin",
  "engineer",
  "reviewer",
  "approver",
  "technician",
  "auditor",
] as const;

export const STAGE_KINDS = ["wash", "rinse", "final_rinse", "drying", "other"] as const;

export const STAGE_MODES = [
  "ultrasonic",
  "spray",
  "injection",
  "flood",
  "immersion",
  "hot_air_drying",
  "vacuum_drying",
] as const;

export const RECIPE_VERSION_STATUSES = [
  "draft",
  "proposed",
  "effective",
  "superseded",
  "withdrawn",
] as const;

export const PARAMETER_KINDS = [
  "temperature",
  "time",
  "concentration",
  "ultrasonic_power",
  "ultrasonic_frequency",
  "spray_pressure",
  "flow",
  "conductivity_limit",
  "drying_temperature",
  "vacuum_pressure",
  "basket_loading",
  // Loading as structured parameters: the numbered load-pattern sheet and the fixture a basket uses.
  "load_pattern",
  "fixture",
  "filter_interval",
  "other",
] as const;

export const DOCUMENT_TYPES = [
  "iq_protocol",
  "oq_protocol",
  "pq_protocol",
  "report",
  "procedure",
  "change_narrative",
] as const;

export const DOCUMENT_STATUSES = [
  "draft",
  "in_review",
  "approved",
  "effective",
  "superseded",
  "retired",
] as const;

export const CHANGE_STATUSES = [
  "draft",
  "impact_assessed",
  "approved_for_implementation",
  "requalification",
  "verified",
  "closed",
  "rejected",
  "withdrawn",
] as const;

export const CHANGE_KINDS = [
  "parameter_change",
  "new_detergent",
  "new_part_family",
  "maintenance_interval",
  "equipment",
  "initial_validation",
  "specification",
] as const;

/** A customer specification revision is in force until a later revision supersedes it. */
export const SPEC_STATUSES = ["in_force", "superseded"] as const;

/** How a part family's wetted surface area was determined. */
export const WETTED_AREA_METHODS = ["cad_model", "measured", "calculated", "estimated"] as const;

export const MATRIX_STATUSES = ["effective", "superseded"] as const;

export const IMPACT_CLASSES = ["editorial", "minor", "major"] as const;

export const TEST_TYPES = [
  "particle_cleanliness",
  "gravimetric",
  "wetting_tension",
  "rinse_conductivity",
  "visual",
  "uv_inspection",
  "dryness",
] as const;

export const RUN_STATUSES = ["open", "performed", "verified", "superseded"] as const;

export const OUTCOMES = ["pass", "fail", "incomplete"] as const;

export const SIGNATURE_MEANINGS = [
  "authored",
  "reviewed",
  "approved",
  "performed",
  "verified",
] as const;

export const SIGNED_RECORD_TYPES = [
  "document_version",
  "change_request",
  "test_run",
  "recipe_version",
  "deviation",
  "nonconformance",
  "control_plan_version",
  "lab_method",
  "training_record",
] as const;

export const EVIDENCE_FILE_KINDS = [
  "lab_report",
  "membrane_image",
  "photo",
  "csv",
  "other",
] as const;

export const BATH_RECORD_KINDS = [
  "bath_change",
  "filter_change",
  "reading",
  "addition",
  "nozzle_check",
  "ultrasonic_foil_test",
] as const;

export const MAINTENANCE_KINDS = [
  "bath_change",
  "filter_change",
  "reading",
  "nozzle_check",
  "ultrasonic_foil_test",
] as const;

/** A bath value's place against its plan: within the action limits, beyond one, or beyond a reject limit. */
export const BATH_LIMIT_STATES = ["ok", "action", "reject"] as const;
export const BATH_CHEMISTRY_KEYS = [
  "concentrationPct",
  "ph",
  "temperatureC",
  "conductivityUsPerCm",
  "oilContentGPerL",
] as const;
export const CHECK_RESULTS = ["pass", "fail"] as const;

export type Role = (typeof ROLES)[number];
export type ParameterKind = (typeof PARAMETER_KINDS)[number];
export type SignatureMeaning = (typeof SIGNATURE_MEANINGS)[number];
export type SignedRecordType = (typeof SIGNED_RECORD_TYPES)[number];

/** Document review routing: who signs in each step, and what they decided. */
export const REVIEW_ROLES = ["reviewer", "approver"] as const;
export const REVIEW_DECISIONS = [
  "reviewed",
  "sent_back",
  "approved",
  "rejected",
  "withdrawn",
] as const;
export const ROUTING_MODES = ["sequence", "parallel"] as const;

export type DocumentType = (typeof DOCUMENT_TYPES)[number];
export type DocumentStatus = (typeof DOCUMENT_STATUSES)[number];
export type ReviewRole = (typeof REVIEW_ROLES)[number];
export type ReviewDecision = (typeof REVIEW_DECISIONS)[number];
export type RoutingMode = (typeof ROUTING_MODES)[number];

export type TestType = (typeof TEST_TYPES)[number];
export type Outcome = (typeof OUTCOMES)[number];
export type EvidenceFileKind = (typeof EVIDENCE_FILE_KINDS)[number];
export type BathRecordKind = (typeof BATH_RECORD_KINDS)[number];

export const API_TOKEN_SCOPES = ["read", "read_write"] as const;
export type ApiTokenScope = (typeof API_TOKEN_SCOPES)[number];

// ── Nonconformances ───────────────────────────────────────────────────────

/** Where a nonconformance came from: a record that failed, or a person who reported it. */
export const NC_SOURCE_KINDS = [
  "run",
  "bath_reading",
  "cycle",
  "calibration",
  "change_effectiveness",
  "manual",
] as const;
/** What a person reports by hand. */
export const NC_MANUAL_KINDS = ["customer_complaint", "field_return", "audit_finding"] as const;
export const NC_SEVERITIES = ["minor", "major", "critical"] as const;
export const NC_STATUSES = [
  "open",
  "contained",
  "cause_found",
  "actions_under_way",
  "effectiveness_check",
  "closed",
  "cancelled",
] as const;
/** What was processed on the recipe and part family: test runs now, wash cycles with lots later. */
export const NC_ITEM_KINDS = ["run", "cycle"] as const;
export const NC_HOLD_STATES = ["pending", "held", "released"] as const;
export const NC_DISPOSITIONS = ["reclean", "use_as_is", "scrap"] as const;
export const NC_CAUSE_METHODS = ["five_whys", "cause_and_effect", "other"] as const;
export const NC_ACTION_KINDS = ["corrective", "preventive"] as const;
export const NC_ACTION_STATUSES = ["open", "in_progress", "done"] as const;
export const NC_EFFECTIVENESS_RESULTS = ["confirmed", "not_effective"] as const;

// ── Lab methods and training ─────────────────────────────────────────────

/** The three kinds of lab method a run cites: how parts were extracted, how the filter was analysed, how residue was weighed. */
export const LAB_METHOD_KINDS = ["extraction", "analysis", "gravimetric"] as const;
export type LabMethodKind = (typeof LAB_METHOD_KINDS)[number];
/** A method version is drafted, approved (citable), then superseded by the next approved version. */
export const LAB_METHOD_STATUSES = ["draft", "approved", "superseded"] as const;
export type LabMethodStatus = (typeof LAB_METHOD_STATUSES)[number];
/** A practical sign-off on a lab method, or a read-and-understood acknowledgement of a procedure version. */
export const TRAINING_KINDS = ["method", "procedure"] as const;
export type TrainingKind = (typeof TRAINING_KINDS)[number];
