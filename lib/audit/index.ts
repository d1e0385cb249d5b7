export { appendAudit } from "./append";
export { verifyAuditChain, type ChainVerification } from "./verify";
export { canonicalJson } from "./canonical-json";
export { sha256Hex } from "./hash";
export {
  AUDIT_EVENT_TYPES,
  SYSTEM_ACTOR,
  type AuditActor,
  type AuditEvent,
  type AuditEventInput,
  type AuditEventType,
} from "./events";
export {
  currentEventType,
  LEGACY_EVENT_TYPES,
  readAuditEvent,
  storedNamesOf,
  type ReadAuditEvent,
} from "./read";
