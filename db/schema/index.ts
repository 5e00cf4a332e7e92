// Every table; the one source of row types. Split by area, read through this index.
export * from "./core";
export * from "./release";
export * from "./traceability";
