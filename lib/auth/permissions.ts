import { ROLES, type Role } from "@/db/enums";

export { ROLES, type Role };

const ALL: readonly Role[] = ROLES;
const ACTORS: readonly Role[] = ["admin", "engineer", "reviewer", "approver", "technician"];
const CONTROLLERS: readonly Role[] = ["admin", "engineer", "reviewer", "approver", "auditor"];

/**
 * Every permission in Washproof and the roles allowed to take it. This table is the
 * single source of authorisation: pages, server actions and route handlers all
 * ask `can()`, and the authorisation tests read this table.
 */
export const PERMISSIONS = {
  // Reading
  "queue.view": ACTORS,
  "overview.view": ALL,
  "systems.view": ALL,
  "parts.view": ALL,
  "documents.view": ALL,
  "changes.view": CONTROLLERS,
  "evidence.view": ALL,
  "trace.view": CONTROLLERS,
  "audit.view": ["admin", "auditor", "approver"],
  "audit.export": ["admin", "auditor"],
  "trace.export": CONTROLLERS,
  "calc.view": ALL,
  // Own account
  "account.change_password": ALL,
  "account.manage_tokens": ALL,
  // Administration (admins never sign on behalf of others)
  "admin.view": ["admin"],
  "users.manage": ["admin"],
  "systems.manage": ["admin"],
  "parts.manage": ["admin", "engineer"],
  "matrix.manage": ["admin"],
  // Documents
  "document.draft": ["engineer"],
  "document.submit": ["engineer"],
  "document.review": ["reviewer"],
  "document.approve": ["approver"],
  "document.export": ALL,
  // Recipes and change control
  "recipe.edit": ["engineer"],
  "recipe.make_effective": ["approver"],
  "change.draft": ["engineer"],
  "change.review": ["reviewer"],
  "change.approve": ["approver"],
  "change.verify": ["reviewer", "approver"],
  // Evidence
  "evidence.record": ["engineer", "technician"],
  "evidence.sign_performed": ["technician"],
  "evidence.verify": ["engineer", "reviewer", "approver", "technician"],
  // Bath and filter log
  "bath.record": ["engineer", "technician"],
  "bath.manage_intervals": ["admin", "engineer"],
  // Temporary deviations
  "deviation.view": ALL,
  "deviation.draft": ["engineer"],
  "deviation.approve": ["approver"],
  "deviation.withdraw": ["engineer", "approver"],
  "deviation.record_lot": ["engineer", "technician"],
  // Nonconformances: anyone who works the process may report one; engineers work them; an
  // approver signs closure; auditors read.
  "nc.view": ["admin", "engineer", "reviewer", "approver", "technician", "auditor"],
  "nc.open": ["engineer", "technician"],
  "nc.work": ["engineer"],
  "nc.approve": ["approver"],
  // Control plans: engineers write them, a reviewer and an approver sign, technicians do the tests.
  "control_plan.view": ALL,
  "control_plan.draft": ["engineer"],
  "control_plan.review": ["reviewer"],
  "control_plan.approve": ["approver"],
  "control_plan.perform": ["technician"],
  // The site's shift times and zone, which per-shift and daily tests follow.
  "site.manage_clock": ["admin"],
  // Instruments: the lab and quality keep the register and record calibrations; all may read it.
  "instrument.view": ALL,
  "instrument.manage": ["admin", "engineer", "technician"],
  // Lab methods and training: engineers draft methods, approvers approve them; a trainer (someone
  // trained on the method, an approver or an administrator — checked in the service) signs off a
  // practical training; each person acknowledges a procedure for themselves.
  "lab.view": ALL,
  "lab.method_draft": ["engineer"],
  "lab.method_approve": ["approver"],
  "training.sign_off": ["admin", "engineer", "approver", "technician"],
  "training.acknowledge": ACTORS,
} as const satisfies Record<string, readonly Role[]>;

/** What the role table grants; "action" is kept for server actions. */
export type Permission = keyof typeof PERMISSIONS;

export function can(roles: readonly Role[], permission: Permission): boolean {
  const allowed: readonly Role[] = PERMISSIONS[permission];
  return roles.some((r) => allowed.includes(r));
}

export const ROLE_LABELS: Record<Role, string> = {
  admin: "Administrator",
  engineer: "Quality engineer",
  reviewer: "Reviewer",
  approver: "Approver",
  technician: "Technician",
  auditor: "Auditor",
};
