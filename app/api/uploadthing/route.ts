import { createRouteHandler } from "uploadthing/next";
import { uploadthingRouteConfig } from "@/lib/uploads/uploadthing";
import { uploadRouter } from "./core";

/** UploadThing's endpoint: the browser asks for presigned URLs here; the service calls back here. */
export const { GET, POST } = createRouteHandler({ router: uploadRouter, config: uploadthingRouteConfig() });
