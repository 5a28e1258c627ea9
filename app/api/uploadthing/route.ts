import { createRouteHandler } from "uploadthing/next";
import { uploadthingRouteConfig } from "@/lib/uploads/uploadthing";
import { uploadRouter } from "@/lib/uploads/file-router";

type Handlers = ReturnType<typeof createRouteHandler>;
let handlers: Handlers | undefined;

/** Built on first request, so the build does not need the upload service's settings. */
function routeHandlers(): Handlers {
  handlers ??= createRouteHandler({ router: uploadRouter, config: uploadthingRouteConfig() });
  return handlers;
}

/** UploadThing's endpoint: the browser asks for presigned URLs here; the service calls back here. */
export const GET = (request: Request) => routeHandlers().GET(request as never);
export const POST = (request: Request) => routeHandlers().POST(request as never);
