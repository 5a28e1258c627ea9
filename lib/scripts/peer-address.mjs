/**
 * Loaded into every `next start` process by serve.mjs: each request's `x-forwarded-for` gets the
 * connection's peer address appended, as a proxy would. Next.js only fills the header in when it
 * is absent, so without this a client could name any address it liked (lib/auth/client-address.ts
 * reads the result with the deployment's number of trusted proxies).
 */
import http from "node:http";

const emit = http.Server.prototype.emit;
http.Server.prototype.emit = function emitWithPeer(event, ...args) {
  if (event === "request") {
    const req = args[0];
    const peer = req?.socket?.remoteAddress;
    if (peer) {
      const given = req.headers["x-forwarded-for"];
      const list = Array.isArray(given) ? given.join(", ") : given;
      req.headers["x-forwarded-for"] = list ? `${list}, ${peer}` : peer;
    }
  }
  return emit.call(this, event, ...args);
};
