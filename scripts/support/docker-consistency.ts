import { readFileSync } from "node:fs";
import { createRequire } from "node:module";
import path from "node:path";
import { z } from "zod";
import { envSchema } from "@/lib/server/env";

// Does docker/ describe what the scripts run? Pure over the files' texts, so a test can plant a
// mismatch in a copy. Each problem is one sentence; an empty list means consistent. YAML through
// js-yaml (a devDependency; it ships no types, hence the one typed require below).

const { load } = createRequire(import.meta.url)("js-yaml") as { load: (text: string) => unknown };

export type DockerFiles = {
  compose: string; dockerfile: string; entrypoint: string; packageJson: string;
  ensurePackages: string; redisScript: string; servicesLib: string;
};

export const DOCKER_FILE_PATHS: Record<keyof DockerFiles, string> = {
  compose: "docker/compose.yaml", dockerfile: "docker/Dockerfile", entrypoint: "docker/entrypoint.sh", packageJson: "package.json",
  ensurePackages: "scripts/services/ensure-packages.sh", redisScript: "scripts/services/redis.sh", servicesLib: "scripts/services/lib.sh",
};

export function readDockerFiles(root: string): DockerFiles {
  const entries = Object.entries(DOCKER_FILE_PATHS).map(([key, file]) => [key, readFileSync(path.join(root, file), "utf8")]);
  return Object.fromEntries(entries) as DockerFiles;
}

const serviceSchema = z.object({
  image: z.string().optional(),
  command: z.array(z.string()).optional(),
  environment: z.record(z.string(), z.union([z.string(), z.number(), z.boolean(), z.null()])).optional(),
  secrets: z.array(z.string()).optional(),
});
const composeSchema = z.object({
  services: z.record(z.string(), serviceSchema),
  "x-emfolio-external": z.record(z.string(), z.string()).default({}),
});
type Service = z.infer<typeof serviceSchema>;

/** Variables the app cannot start without: those the schema refuses when absent. */
export function requiredEnvNames(): string[] {
  return Object.entries(envSchema.shape).filter(([, field]) => !field.safeParse(undefined).success).map(([name]) => name);
}

/** The entrypoint's secrets: VARIABLE → { secret, needs (a variable that must be set too) }. */
function entrypointVariables(entrypoint: string): Map<string, { secret: string; needs?: string }> {
  const found = new Map<string, { secret: string; needs?: string }>();
  for (const m of entrypoint.matchAll(/^from_secret (\w+) (\w+)\s*$/gm)) found.set(m[1] ?? "", { secret: m[2] ?? "" });
  for (const m of entrypoint.matchAll(/^\s*(\w+)="\w+:\/\/.*read_secret (\w+).*@\$\{(\w+)\}/gm)) found.set(m[1] ?? "", { secret: m[2] ?? "", needs: m[3] ?? "" });
  return found;
}

/** A command with the local `node_modules/.bin/` dropped and the values of --host and --port (which may differ) blanked. */
export function normaliseCommand(words: readonly string[]): string {
  return words.map((w, i) => (words[i - 1] === "--host" || words[i - 1] === "--port" ? "*" : w.replace(/^node_modules\/\.bin\//, ""))).join(" ");
}

function bashArray(text: string, name: string): string[] {
  const m = new RegExp(`^${name}=\\(([^)]*)\\)`, "m").exec(text);
  return m?.[1]?.split(/\s+/).filter(Boolean) ?? [];
}

/** `--name value` pairs of the Redis settings both places set, from a flag list. */
function redisSettings(words: readonly string[]): Record<string, string> {
  const keys = ["appendonly", "appendfsync", "save", "maxmemory-policy"];
  return Object.fromEntries(keys.map((k) => [k, words[words.indexOf(`--${k}`) + 1] ?? "(unset)"]).filter(([k]) => words.includes(`--${k}`)));
}

function shellWords(text: string): string[] {
  return [...text.matchAll(/'([^']*)'|"([^"]*)"|(\S+)/g)].map((m) => m[1] ?? m[2] ?? m[3] ?? "");
}

export function checkDockerConsistency(files: DockerFiles): string[] {
  const problems: string[] = [];
  const compose = composeSchema.parse(load(files.compose));
  const scripts = z.record(z.string(), z.string()).parse((JSON.parse(files.packageJson) as { scripts: unknown }).scripts);
  const service = (name: string): Service | undefined => compose.services[name];
  const env = (s: Service | undefined) => s?.environment ?? {};

  for (const name of bashArray(files.servicesLib, "ALL_SERVICES")) {
    if (service(name)) continue;
    const variable = compose["x-emfolio-external"][name];
    if (!variable) problems.push(`scripts/services.sh starts ${name}, which docker/compose.yaml neither runs nor lists under x-emfolio-external`);
    else for (const app of ["web", "worker"]) {
      const set = env(service(app))[variable] !== undefined || entrypointVariables(files.entrypoint).has(variable);
      if (!set) problems.push(`${app} is not given ${variable}, the external ${name} it needs`);
    }
  }

  const fromSecrets = entrypointVariables(files.entrypoint);
  for (const app of ["web", "worker"]) {
    const s = service(app);
    if (!s) { problems.push(`docker/compose.yaml has no ${app} service`); continue; }
    for (const name of requiredEnvNames()) {
      const value = env(s)[name];
      if (value !== undefined && value !== null && String(value) !== "") continue;
      const built = fromSecrets.get(name);
      const ok = built && (s.secrets ?? []).includes(built.secret) && (!built.needs || (env(s)[built.needs] ?? "") !== "");
      if (!ok) problems.push(`${app} lacks ${name} (required by lib/server/env.ts): not in its environment, nor made by docker/entrypoint.sh from a secret it mounts`);
    }
  }

  const commands: Array<[string, string]> = [["web", "start"], ["worker", "worker"], ["migrate", "db:migrate"]];
  for (const [name, script] of commands) {
    const got = normaliseCommand(service(name)?.command ?? []);
    const want = normaliseCommand(shellWords(scripts[script] ?? ""));
    if (got !== want) problems.push(`compose ${name} runs "${got}" but package.json "${script}" runs "${want}"`);
  }
  const cmd = /^CMD (\[.*\])\s*$/m.exec(files.dockerfile)?.[1];
  const dockerCmd = normaliseCommand(cmd ? z.array(z.string()).parse(JSON.parse(cmd)) : []);
  if (dockerCmd !== normaliseCommand(service("web")?.command ?? [])) problems.push(`docker/Dockerfile CMD "${dockerCmd}" is not the compose web command`);
  if (!/^ENTRYPOINT .*emfolio-entrypoint/m.test(files.dockerfile)) problems.push("docker/Dockerfile does not run docker/entrypoint.sh, which turns the secrets into variables");

  const major = (image: string | undefined) => /:(\d+)/.exec(image ?? "")?.[1];
  const pgWant = /^PG_MAJOR=(\d+)/m.exec(files.ensurePackages)?.[1];
  const redisWant = /^REDIS_MAJOR=(\d+)/m.exec(files.ensurePackages)?.[1];
  if (!pgWant || major(service("postgres")?.image) !== pgWant) problems.push(`compose postgres is ${service("postgres")?.image ?? "missing"}, ensure-packages installs PostgreSQL ${pgWant ?? "(no PG_MAJOR)"}`);
  if (!redisWant || major(service("redis")?.image) !== redisWant) problems.push(`compose redis is ${service("redis")?.image ?? "missing"}, ensure-packages installs Redis ${redisWant ?? "(no REDIS_MAJOR)"}`);

  const local = redisSettings(shellWords(files.redisScript.replace(/\\\n/g, " ")));
  const deployed = redisSettings(service("redis")?.command ?? []);
  for (const [key, value] of Object.entries(local)) {
    if (deployed[key] !== value) problems.push(`compose redis has --${key} ${deployed[key] ?? "(unset)"}, scripts/services/redis.sh --${key} ${value === "" ? "''" : value}`);
  }
  return problems;
}
