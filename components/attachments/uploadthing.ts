import { generateReactHelpers } from "@uploadthing/react";
import type { UploadRouter } from "@/app/api/uploadthing/core";

// Typed against the app's file router; talks to /api/uploadthing on the page's own origin.
export const { useUploadThing } = generateReactHelpers<UploadRouter>();
