import type { Role } from "../../db/schema/common";

/**
 * The pure role × permission table. The UI may call `can()` to hide a button; the server always
 * checks again through lib/auth/guard.ts.
 */
export const PERMISSIONS = [
  // client side
  "request:create",
  "request:read_own",
  "request:read_org",
  "request:edit_draft",
  "quote:accept",
  "payment:pay",
  "message:post",
  "members:manage",
  "billing:manage",
  "files:delete_early",
  // staff side
  "admin:access",
  "sales:inbox",
  "quote:manage",
  "production:board",
  "production:schedule",
  "production:record",
  "production:capacity",
  "accounts:ledger",
  "accounts:refund",
  "accounts:terms",
  "admin:staff",
  "admin:catalogue",
  "admin:audit",
  "admin:outbox",
  "request:read_any",
] as const;
export type Permission = (typeof PERMISSIONS)[number];

const CLIENT: Permission[] = ["request:create", "request:read_own", "request:edit_draft", "quote:accept", "payment:pay", "message:post"];
const STAFF_BASE: Permission[] = ["admin:access", "request:read_any"];

export const ROLE_PERMISSIONS: Record<Role, ReadonlySet<Permission>> = {
  client: new Set(CLIENT),
  client_admin: new Set<Permission>([...CLIENT, "request:read_org", "members:manage", "billing:manage", "files:delete_early"]),
  sales: new Set<Permission>([...STAFF_BASE, "sales:inbox", "quote:manage", "message:post"]),
  production: new Set<Permission>([...STAFF_BASE, "production:board", "production:schedule", "production:record", "production:capacity"]),
  accounts: new Set<Permission>([...STAFF_BASE, "accounts:ledger", "accounts:refund", "accounts:terms"]),
  admin: new Set<Permission>(PERMISSIONS),
};

export interface PolicyUser {
  id: string;
  role: Role;
  orgId: string | null;
  isControlledCleared: boolean;
}

/** A record's owner, for organisation scope and controlled data. */
export interface PolicyResource {
  orgId: string;
  createdById?: string;
  isControlled?: boolean;
}

export function isStaff(role: Role): boolean {
  return role === "sales" || role === "production" || role === "accounts" || role === "admin";
}

export function hasPermission(user: Pick<PolicyUser, "role">, permission: Permission): boolean {
  return ROLE_PERMISSIONS[user.role].has(permission);
}

/** May this user see this record at all? Staff: any; client_admin: own firm; client: own requests. */
export function canSee(user: PolicyUser, resource: PolicyResource): boolean {
  if (isStaff(user.role)) return true;
  if (!user.orgId || user.orgId !== resource.orgId) return false;
  if (user.role === "client_admin") return true;
  return resource.createdById === undefined || resource.createdById === user.id;
}

/** May this user open the files of this record? Controlled records: own firm, or cleared staff. */
export function canOpenFiles(user: PolicyUser, resource: PolicyResource): boolean {
  if (!canSee(user, resource)) return false;
  if (!resource.isControlled) return true;
  if (isStaff(user.role)) return user.isControlledCleared;
  return true;
}

/**
 * May this user open this stored file? A loose upload (not yet attached to a request): its uploader,
 * or staff. A request's model file or document: the request's file rule (canOpenFiles).
 */
export function canOpenStoredFile(
  user: PolicyUser,
  file: { kind: "upload"; uploaderId: string | null } | { kind: "revision" | "document"; orgId: string; createdById: string; isControlled: boolean },
): boolean {
  if (file.kind === "upload") return file.uploaderId === user.id || isStaff(user.role);
  return canOpenFiles(user, { orgId: file.orgId, createdById: file.createdById, isControlled: file.isControlled });
}

/**
 * May this user estimate from this upload? Its uploader; staff; or, for a firm's upload, whoever
 * the firm's scope lets see it (a client lead: any colleague's; a client engineer: only their own).
 */
export function canUseUpload(user: PolicyUser, upload: { userId: string; orgId: string | null }): boolean {
  if (upload.userId === user.id || isStaff(user.role)) return true;
  return upload.orgId !== null && canSee(user, { orgId: upload.orgId, createdById: user.role === "client" ? upload.userId : undefined });
}

/** The permission check, with the resource's scope when one is given. */
export function can(user: PolicyUser, permission: Permission, resource?: PolicyResource): boolean {
  if (!hasPermission(user, permission)) return false;
  return resource ? canSee(user, resource) : true;
}

/** The issued documents each staff role's work needs; clients see every kind on what they may see. */
export const STAFF_DOCUMENT_KINDS: Record<"sales" | "production" | "accounts" | "admin", ReadonlySet<string>> = {
  sales: new Set(["quote", "deposit_invoice", "invoice"]),
  production: new Set(["packing_list"]),
  accounts: new Set(["quote", "deposit_invoice", "invoice", "credit_note"]),
  admin: new Set(["quote", "deposit_invoice", "invoice", "credit_note", "packing_list"]),
};

/** May this user open an issued document of this kind on this record? */
export function canReadDocument(user: PolicyUser, kind: string, resource: PolicyResource): boolean {
  if (!canSee(user, resource)) return false;
  if (user.role === "client" || user.role === "client_admin") return true;
  return STAFF_DOCUMENT_KINDS[user.role].has(kind);
}

/** Where each role lands after signing in. */
export function homePathFor(role: Role): string {
  switch (role) {
    case "client":
    case "client_admin":
      return "/portal";
    case "sales":
      return "/admin/sales";
    case "production":
      return "/admin/production";
    case "accounts":
      return "/admin/accounts";
    case "admin":
      return "/admin";
  }
}
