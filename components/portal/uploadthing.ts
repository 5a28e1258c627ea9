"use client";

import { generateReactHelpers } from "@uploadthing/react";
import type { UploadRouter } from "@/lib/uploads/file-router";

/** Typed UploadThing hooks for our file router (/api/uploadthing). */
export const { useUploadThing } = generateReactHelpers<UploadRouter>();

/** Limits shown in the forms; the file router enforces the same. */
export const MODEL_LIMIT = { bytes: 256 * 1024 * 1024, label: "256 MB" };
export const ATTACHMENT_LIMIT = { bytes: 32 * 1024 * 1024, label: "32 MB" };
export const MODEL_ACCEPT = ".stl,.obj,.3mf,.step,.stp,.igs,.iges";
