import path from "node:path";
import { describe, expect, it } from "vitest";
import { checkDockerConsistency, normaliseCommand, readDockerFiles, requiredEnvNames, type DockerFiles } from "@/scripts/support/docker-consistency";

// docker/ must describe what the scripts run: the same services, commands, required settings,
// PostgreSQL/Redis majors and Redis settings. The real files pass; each planted mismatch fails.

const real = readDockerFiles(path.resolve(import.meta.dirname, "../../.."));

/** A copy of the files with one text replaced; the replacement must change something. */
function planted(file: keyof DockerFiles, from: string | RegExp, to: string): DockerFiles {
  const changed = real[file].replace(from, to);
  if (changed === real[file]) throw new Error(`the plant in ${file} matched nothing: ${String(from)}`);
  return { ...real, [file]: changed };
}

describe("checkDockerConsistency(docker/, package.json, scripts/services)", () => {
  it("checkDockerConsistency finds nothing wrong in the repository's own files", () => {
    expect(checkDockerConsistency(real)).toEqual([]);
  });

  it("requiredEnvNames lists the variables lib/server/env.ts cannot default", () => {
    expect(requiredEnvNames().sort()).toEqual(["DATABASE_URL", "NEXTAUTH_SECRET", "NEXTAUTH_URL", "REDIS_URL", "S3_ACCESS_KEY_ID", "S3_BUCKET", "S3_ENDPOINT", "S3_SECRET_ACCESS_KEY"]);
  });

  it("normaliseCommand drops node_modules/.bin and blanks --host and --port values only", () => {
    expect(normaliseCommand(["node_modules/.bin/tsx", "scripts/serve.ts", "--host", "0.0.0.0", "--port", "3000"])).toBe("tsx scripts/serve.ts --host * --port *");
    expect(normaliseCommand(["tsx", "scripts/serve.ts", "--dev"])).toBe("tsx scripts/serve.ts --dev");
  });

  const plants: Array<[string, DockerFiles, RegExp]> = [
    ["a worker command that is not package.json's", planted("compose", '["node_modules/.bin/tsx", "worker/index.ts"]', '["node", "worker/index.js"]'), /compose worker runs "node worker\/index.js"/],
    ["a web command that is not package.json's start", planted("compose", '"scripts/serve.ts", "--host", "0.0.0.0"', '"scripts/serve.ts", "--dev", "--host", "0.0.0.0"'), /compose web runs/],
    ["a migrate command of another script", planted("compose", '"scripts/migrate.ts"]', '"scripts/seed.ts"]'), /compose migrate runs "tsx scripts\/seed.ts"/],
    ["an image CMD other than the web command", planted("dockerfile", /^CMD .*$/m, 'CMD ["node_modules/.bin/next", "start"]'), /Dockerfile CMD "next start"/],
    ["a required variable missing from the app env", planted("compose", /^ {2}NEXTAUTH_URL: .*\n/m, ""), /web lacks NEXTAUTH_URL[\s\S]*worker lacks NEXTAUTH_URL/],
    ["a secret the entrypoint needs not mounted", planted("compose", "x-app-secrets: &app-secrets\n  - emfolio_db_password\n", "x-app-secrets: &app-secrets\n"), /lacks DATABASE_URL/],
    ["a Redis host without the password secret", planted("compose", "  - emfolio_db_password\n  - emfolio_redis_password\n", "  - emfolio_db_password\n"), /web lacks REDIS_URL/],
    ["an entrypoint that no longer fills a variable", planted("entrypoint", /^from_secret NEXTAUTH_SECRET .*\n/m, ""), /lacks NEXTAUTH_SECRET/],
    ["a service the scripts start missing from compose", planted("servicesLib", "ALL_SERVICES=(postgres redis s3 smtp uploadthing)", "ALL_SERVICES=(postgres redis s3 smtp uploadthing clamav)"), /starts clamav/],
    ["another PostgreSQL major in compose", planted("compose", "image: postgres:15", "image: postgres:16"), /compose postgres is postgres:16/],
    ["another PostgreSQL major in ensure-packages", planted("ensurePackages", /^PG_MAJOR=\d+/m, "PG_MAJOR=17"), /installs PostgreSQL 17/],
    ["another Redis major", planted("compose", "image: redis:7", "image: redis:8"), /compose redis is redis:8/],
    ["a Redis setting that differs", planted("compose", "      - --maxmemory-policy\n      - noeviction", "      - --maxmemory-policy\n      - allkeys-lru"), /--maxmemory-policy allkeys-lru/],
    ["a Redis setting the scripts have and compose lacks", planted("compose", '      - --save\n      - ""\n', ""), /--save \(unset\)/],
  ];
  for (const [what, files, message] of plants) {
    it(`checkDockerConsistency reports ${what}`, () => {
      const problems = checkDockerConsistency(files);
      expect(problems.length).toBeGreaterThan(0);
      expect(problems.join("\n")).toMatch(message);
    });
  }
});
