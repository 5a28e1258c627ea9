import { NextResponse, type NextRequest } from "next/server";

/**
 * Two jobs, neither of them security:
 * - gives every request an id (`x-request-id`, kept from a front proxy when it is a plain token),
 *   passed to the handlers and returned on the response, so logs of one request join up and a
 *   user can quote it;
 * - redirects the signed-out away from private areas. Every page, action and handler checks
 *   again through lib/auth/guard.ts.
 */
const SESSION_COOKIES = ["authjs.session-token", "__Secure-authjs.session-token"];
const REQUEST_ID_HEADER = "x-request-id";
const PRIVATE_PREFIXES = ["/portal", "/admin"];

function requestIdOf(request: NextRequest): string {
  const given = request.headers.get(REQUEST_ID_HEADER);
  return given && /^[A-Za-z0-9._:-]{8,80}$/.test(given) ? given : crypto.randomUUID();
}

export function proxy(request: NextRequest) {
  const requestId = requestIdOf(request);
  const path = request.nextUrl.pathname;
  const isPrivate = PRIVATE_PREFIXES.some((p) => path === p || path.startsWith(`${p}/`));
  const hasSession = SESSION_COOKIES.some((name) => request.cookies.has(name));
  if (isPrivate && !hasSession) {
    const url = request.nextUrl.clone();
    url.pathname = "/sign-in";
    url.search = `?callbackUrl=${encodeURIComponent(request.nextUrl.pathname + request.nextUrl.search)}`;
    const res = NextResponse.redirect(url);
    res.headers.set(REQUEST_ID_HEADER, requestId);
    return res;
  }
  const forwarded = new Headers(request.headers);
  forwarded.set(REQUEST_ID_HEADER, requestId);
  const res = NextResponse.next({ request: { headers: forwarded } });
  res.headers.set(REQUEST_ID_HEADER, requestId);
  return res;
}

// Everything but the build's static files, the optimised images and the icon.
export const config = { matcher: ["/((?!_next/static|_next/image|favicon.ico).*)"] };
