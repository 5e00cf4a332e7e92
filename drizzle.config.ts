import { defineConfig } from "drizzle-kit";

// drizzle-kit only generates SQL here; migrations are applied by scripts/migrate.ts at start-up.
export default defineConfig({
  dialect: "postgresql",
  schema: ["./db/schema/core.ts", "./db/schema/release.ts", "./db/schema/traceability.ts"],
  out: "./db/migrations",
});
