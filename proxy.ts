import { NextResponse, type NextRequest } from "next/server";

/**
 * Two jobs, neither of them security, for pages and server actions:
 * - gives every request an id (`x-request-id`, kept from a front proxy when it is a plain token),
 *   passed to the handlers and returned on the response, so logs of one request join up and a
 *   user can quote it;
 * - redirects the signed-out away from private areas. Every page, action and handler checks
 *   again through lib/auth/guard.ts.
 * It does not run for /api (see `config`): the route wrapper (lib/server/define-route.ts) gives
 * those requests their id, the same way, and the routes answer the signed-out with 401.
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

/**
 * Pages and actions only. Left out: the build's static files, the optimised images, the files of
 * public/ and /api, whose routes need neither job (the proxy's request-header copy cost about as
 * much CPU as the list API's own work). Auth.js's and the upload service's handlers are not on
 * the route wrapper, so they keep the proxy for their request id.
 */
export const config = {
  matcher: [
    "/((?!api/|_next/static|_next/image|favicon.ico|icon.svg|icon-192.png|icon-512.png|icon-maskable-512.png|apple-touch-icon.png|manifest.webmanifest|robots.txt).*)",
    "/api/auth/:path*",
    "/api/uploadthing/:path*",
  ],
};
