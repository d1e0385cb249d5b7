export { appendAudit } from "./append";
export { verifyAuditChain, type ChainVerification } from "./verify";
export { canonicalJson } from "./canonical-json";
export { sha256Hex } from "./hash";
export { SYSTEM_ACTOR, type AuditActor, type AuditAction, type AuditEventInput } from "./events";
