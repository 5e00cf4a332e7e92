import { describe, expect, it } from "vitest";
import { envSchema } from "@/lib/server/env";

const good = {
  DATABASE_URL: "postgresql://u:p@127.0.0.1:5432/db", REDIS_URL: "redis://127.0.0.1:6379/0",
  S3_ENDPOINT: "http://127.0.0.1:9000", S3_ACCESS_KEY_ID: "k", S3_SECRET_ACCESS_KEY: "s", S3_BUCKET: "b",
  NEXTAUTH_SECRET: "x".repeat(32), NEXTAUTH_URL: "http://127.0.0.1:3000",
};

describe("envSchema", () => {
  it("accepts a complete environment and fills defaults", () => {
    const env = envSchema.parse(good);
    expect(env.SMTP_PORT).toBe(2529);
    expect(env.QUEUE_PREFIX).toBe("emfolio");
    expect(env.UPLOAD_MAX_BYTES).toBe(2 * 1024 ** 3);
    expect(env.UPLOAD_ABANDON_HOURS).toBe(24);
  });
  it("keeps UPLOAD_ABANDON_HOURS at least twice the 1 h life of an upload URL", () => {
    expect(envSchema.parse({ ...good, UPLOAD_ABANDON_HOURS: "2" }).UPLOAD_ABANDON_HOURS).toBe(2);
    const result = envSchema.safeParse({ ...good, UPLOAD_ABANDON_HOURS: "1" });
    expect(result.error?.issues[0]?.message).toMatch(/at least 2/);
  });
  it("treats an empty string as missing and names the variable", () => {
    const result = envSchema.safeParse({ ...good, DATABASE_URL: "  " });
    expect(result.success).toBe(false);
    expect(result.error?.issues.map((i) => i.path.join("."))).toContain("DATABASE_URL");
  });
  it("rejects a short secret and a non-numeric port", () => {
    const result = envSchema.safeParse({ ...good, NEXTAUTH_SECRET: "short", SMTP_PORT: "twenty" });
    expect(result.error?.issues.map((i) => i.path[0]).sort()).toEqual(["NEXTAUTH_SECRET", "SMTP_PORT"]);
  });
});
