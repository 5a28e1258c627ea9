import { describe, expect, it } from "vitest";
import { ROLES, type Role } from "../../db/schema/common";
import { can, canOpenFiles, canOpenStoredFile, canReadDocument, canUseUpload, canSee, hasPermission, homePathFor, isStaff, PERMISSIONS, type Permission, type PolicyUser } from "./policy";

const user = (role: Role, over: Partial<PolicyUser> = {}): PolicyUser => ({
  id: `${role}-1`,
  role,
  orgId: role === "client" || role === "client_admin" ? "org-a" : null,
  isControlledCleared: false,
  ...over,
});

/** The expected table, written out by hand so that a changed grant fails here. */
const EXPECTED: Record<Role, Permission[]> = {
  client: ["request:create", "request:read_own", "request:edit_draft", "quote:accept", "payment:pay", "message:post"],
  client_admin: ["request:create", "request:read_own", "request:read_org", "request:edit_draft", "quote:accept", "payment:pay", "message:post", "members:manage", "billing:manage", "files:delete_early"],
  sales: ["admin:access", "request:read_any", "sales:inbox", "quote:manage", "message:post"],
  production: ["admin:access", "request:read_any", "production:board", "production:schedule", "production:record", "production:capacity"],
  accounts: ["admin:access", "request:read_any", "accounts:ledger", "accounts:refund", "accounts:terms"],
  admin: [...PERMISSIONS],
};

describe("role × permission matrix", () => {
  for (const role of ROLES) {
    for (const permission of PERMISSIONS) {
      const expected = EXPECTED[role].includes(permission);
      it(`${role} ${expected ? "has" : "lacks"} ${permission}`, () => {
        expect(hasPermission(user(role), permission)).toBe(expected);
      });
    }
  }
});

describe("organisation scope", () => {
  const own = { orgId: "org-a", createdById: "client-1" };
  const colleague = { orgId: "org-a", createdById: "someone-else" };
  const other = { orgId: "org-b", createdById: "x" };

  it("a client sees their own requests, not a colleague's, never another firm's", () => {
    expect(canSee(user("client"), own)).toBe(true);
    expect(canSee(user("client"), colleague)).toBe(false);
    expect(canSee(user("client"), other)).toBe(false);
  });
  it("a client_admin sees every request of the firm, none of another firm", () => {
    expect(canSee(user("client_admin"), colleague)).toBe(true);
    expect(canSee(user("client_admin"), other)).toBe(false);
  });
  it("a client without a firm sees nothing", () => {
    expect(canSee(user("client", { orgId: null }), own)).toBe(false);
  });
  it("staff see every firm's requests", () => {
    for (const role of ["sales", "production", "accounts", "admin"] as const) expect(canSee(user(role), other)).toBe(true);
  });
  it("can() combines the permission with the scope", () => {
    expect(can(user("client"), "quote:accept", own)).toBe(true);
    expect(can(user("client"), "quote:accept", other)).toBe(false);
    expect(can(user("sales"), "quote:accept", own)).toBe(false);
  });
});

describe("controlled files", () => {
  const controlled = { orgId: "org-a", createdById: "client-1", isControlled: true };
  it("only cleared staff open a controlled request's files", () => {
    expect(canOpenFiles(user("sales"), controlled)).toBe(false);
    expect(canOpenFiles(user("sales", { isControlledCleared: true }), controlled)).toBe(true);
    expect(canOpenFiles(user("admin"), controlled)).toBe(false);
  });
  it("the client firm opens its own controlled files; another firm never", () => {
    expect(canOpenFiles(user("client"), controlled)).toBe(true);
    expect(canOpenFiles(user("client_admin", { orgId: "org-b" }), controlled)).toBe(false);
  });
});

describe("stored files", () => {
  const ROLES_ALL = ["client", "client_admin", "sales", "production", "accounts", "admin"] as const;
  it("a loose upload opens for its uploader and for staff, every role checked", () => {
    for (const role of ROLES_ALL) {
      const u = user(role);
      expect(canOpenStoredFile({ ...u, id: "uploader" }, { kind: "upload", uploaderId: "uploader" }), role).toBe(true);
      expect(canOpenStoredFile({ ...u, id: "someone-else" }, { kind: "upload", uploaderId: "uploader" }), role).toBe(isStaff(role));
    }
  });
  it("a request's model file or document follows the request's file rule, every role checked", () => {
    for (const kind of ["revision", "document"] as const) {
      for (const role of ROLES_ALL) {
        for (const isControlled of [false, true]) {
          const file = { kind, orgId: "org-a", createdById: "client-1", isControlled };
          const u = user(role);
          expect(canOpenStoredFile(u, file), `${kind} ${role} controlled=${isControlled}`).toBe(canOpenFiles(u, file));
          expect(canOpenStoredFile({ ...u, orgId: u.orgId ? "org-b" : null }, { ...file }), `${kind} ${role} other firm`).toBe(isStaff(role) ? !isControlled : false);
        }
      }
    }
  });
});

describe("estimating from an upload", () => {
  it("its uploader and staff; a client lead for the firm's uploads; a client engineer only their own; another firm never", () => {
    const upload = { userId: "client-other", orgId: "org-a" };
    const expected: Record<Role, boolean> = { client: false, client_admin: true, sales: true, production: true, accounts: true, admin: true };
    for (const role of ROLES) {
      expect(canUseUpload(user(role), upload), role).toBe(expected[role]);
      expect(canUseUpload({ ...user(role), id: "client-other" }, upload), `${role} as uploader`).toBe(true);
      expect(canUseUpload(user(role, { orgId: role.startsWith("client") ? "org-b" : null }), upload), `${role} of another firm`).toBe(!role.startsWith("client"));
    }
  });
});

describe("homes", () => {
  it("each role lands on its own home", () => {
    expect(ROLES.map(homePathFor)).toEqual(["/portal", "/portal", "/admin/sales", "/admin/production", "/admin/accounts", "/admin"]);
    expect(ROLES.filter(isStaff)).toEqual(["sales", "production", "accounts", "admin"]);
  });
});

describe("issued documents by role", () => {
  const kinds = ["quote", "deposit_invoice", "invoice", "credit_note", "packing_list"] as const;
  const mine = { orgId: "org-a", createdById: "u1" };
  const theirs = { orgId: "org-b", createdById: "u9" };
  it.each([
    ["client", "org-a", [true, true, true, true, true], [false, false, false, false, false]],
    ["client_admin", "org-a", [true, true, true, true, true], [false, false, false, false, false]],
    ["sales", null, [true, true, true, false, false], [true, true, true, false, false]],
    ["production", null, [false, false, false, false, true], [false, false, false, false, true]],
    ["accounts", null, [true, true, true, true, false], [true, true, true, true, false]],
    ["admin", null, [true, true, true, true, true], [true, true, true, true, true]],
  ] as const)("%s", (role, orgId, own, other) => {
    const u = { ...user(role), id: "u1", orgId };
    expect(kinds.map((k) => canReadDocument(u, k, mine))).toEqual(own);
    expect(kinds.map((k) => canReadDocument(u, k, theirs))).toEqual(other);
  });
  it("a client sees a colleague's order's documents only as the firm's client_admin", () => {
    const colleague = { orgId: "org-a", createdById: "u2" };
    expect(canReadDocument({ ...user("client"), id: "u1", orgId: "org-a" }, "invoice", colleague)).toBe(false);
    expect(canReadDocument({ ...user("client_admin"), id: "u1", orgId: "org-a" }, "invoice", colleague)).toBe(true);
  });
});
