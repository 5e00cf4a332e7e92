import { defineConfig } from "drizzle-kit";

// drizzle-kit only generates SQL here; migrations are applied by scripts/migrate.ts at start-up.
export default defineConfig({
  dialect: "postgresql",
  schema: "./db/schema.ts",
  out: "./db/migrations",
});
