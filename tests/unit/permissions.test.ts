import { describe, expect, it } from "vitest";
import { can, PERMISSIONS, ROLES, type Permission, type Role } from "@/lib/auth/permissions";

/**
 * The expected grants, written out independently of the table so that a change
 * to the table must be made twice, on purpose. Rows: action → roles allowed.
 */
const EXPECTED: Record<Permission, Role[]> = {
  "queue.view": ["admin", "engineer", "reviewer", "approver", "technician"],
  "overview.view": [...ROLES],
  "systems.view": [...ROLES],
  "parts.view": [...ROLES],
  "documents.view": [...ROLES],
  "changes.view": ["admin", "engineer", "reviewer", "approver", "auditor"],
  "evidence.view": [...ROLES],
  "trace.view": ["admin", "engineer", "reviewer", "approver", "auditor"],
  "audit.view": ["admin", "auditor", "approver"],
  "audit.export": ["admin", "auditor"],
  "trace.export": ["admin", "engineer", "reviewer", "approver", "auditor"],
  "calc.view": [...ROLES],
  "account.change_password": [...ROLES],
  "account.manage_tokens": [...ROLES],
  "admin.view": ["admin"],
  "users.manage": ["admin"],
  "systems.manage": ["admin"],
  "parts.manage": ["admin", "engineer"],
  "matrix.manage": ["admin"],
  "document.draft": ["engineer"],
  "document.submit": ["engineer"],
  "document.review": ["reviewer"],
  "document.approve": ["approver"],
  "document.export": [...ROLES],
  "recipe.edit": ["engineer"],
  "recipe.make_effective": ["approver"],
  "change.draft": ["engineer"],
  "change.review": ["reviewer"],
  "change.approve": ["approver"],
  "change.verify": ["reviewer", "approver"],
  "evidence.record": ["engineer", "technician"],
  "evidence.sign_performed": ["technician"],
  "evidence.verify": ["engineer", "reviewer", "approver", "technician"],
  "bath.record": ["engineer", "technician"],
  "bath.manage_intervals": ["admin", "engineer"],
  "deviation.view": ["admin", "engineer", "reviewer", "approver", "technician", "auditor"],
  "deviation.draft": ["engineer"],
  "deviation.approve": ["approver"],
  "deviation.withdraw": ["engineer", "approver"],
  "deviation.record_lot": ["engineer", "technician"],
  "nc.view": ["admin", "engineer", "reviewer", "approver", "technician", "auditor"],
  "nc.open": ["engineer", "technician"],
  "nc.work": ["engineer"],
  "nc.approve": ["approver"],
  "control_plan.view": ["admin", "engineer", "reviewer", "approver", "technician", "auditor"],
  "control_plan.draft": ["engineer"],
  "control_plan.review": ["reviewer"],
  "control_plan.approve": ["approver"],
  "control_plan.perform": ["technician"],
  "site.manage_clock": ["admin"],
  "instrument.view": ["admin", "engineer", "reviewer", "approver", "technician", "auditor"],
  "instrument.manage": ["admin", "engineer", "technician"],
  "lab.view": ["admin", "engineer", "reviewer", "approver", "technician", "auditor"],
  "lab.method_draft": ["engineer"],
  "lab.method_approve": ["approver"],
  "training.sign_off": ["admin", "engineer", "approver", "technician"],
  "training.acknowledge": ["admin", "engineer", "reviewer", "approver", "technician"],
};

describe("role table", () => {
  it("lists exactly the expected actions", () => {
    expect(Object.keys(PERMISSIONS).sort()).toEqual(Object.keys(EXPECTED).sort());
  });

  for (const action of Object.keys(EXPECTED) as Permission[]) {
    for (const role of ROLES) {
      const allowed = EXPECTED[action].includes(role);
      it(`${role} ${allowed ? "may" : "may not"} ${action}`, () => {
        expect(can([role], action)).toBe(allowed);
      });
    }
  }

  it("the auditor writes nothing", () => {
    const writes = (Object.keys(PERMISSIONS) as Permission[]).filter(
      (a) => !/\.(view|export)$/.test(a) && !a.startsWith("account."),
    );
    expect(writes.filter((a) => can(["auditor"], a))).toEqual([]);
  });

  it("no role may both draft and approve a document by itself, but several roles combine", () => {
    expect(ROLES.filter((r) => can([r], "document.draft") && can([r], "document.approve"))).toEqual(
      [],
    );
    expect(can(["engineer", "approver"], "document.approve")).toBe(true);
    expect(can([], "systems.view")).toBe(false);
  });
});
