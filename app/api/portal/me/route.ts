import { portalMe } from "@/lib/contracts/portal";
import { defineRoute } from "@/lib/server/define-route";

/**
 * GET /api/portal/me → `{ name, email, role }` of the signed-in user (401 signed out, 403 staff
 * still without their second factor). The portal home is one static page for everyone; its
 * header and table ask this who they are drawing for. Staff get their role too: the page sends
 * them to /admin.
 */
export const GET = defineRoute({ access: "signed-in", response: portalMe, headers: { "cache-control": "no-store" } }, async ({ user }) => ({
  name: user.name,
  email: user.email,
  role: user.role,
}));
