// Lets Node scripts (demo seeding) import modules marked `server-only`: that marker guards against
// client bundles and means nothing outside Next's bundler, where its default entry throws.
import { register } from "node:module";

register("./server-only-resolve.mjs", import.meta.url);
