import { expect, test, type APIRequestContext } from "@playwright/test";
import { readFileSync } from "node:fs";
import path from "node:path";
import { signIn } from "./support";

// Every server action of the built app, POSTed directly (no page, no form) by a signed-in user whose
// role may not use it. The list of actions comes from the build's own manifest, so an action added
// without an entry in ALLOWED below fails the first test until someone decides who may call it.

type Role = "admin" | "qa" | "operator" | "kestrum";

/** Who may call each action: `${file}#${export}` -> roles. Everyone else must be refused. */
const ALLOWED: Record<string, readonly Role[]> = {
  "app/(app)/account/actions.ts#endOtherSessionsAction": ["admin", "qa", "operator", "kestrum"],
  "app/(app)/account/actions.ts#signOutEverywhereAction": ["admin", "qa", "operator", "kestrum"],
  "app/(app)/units/unit-actions.ts#createUnitAction": ["admin", "operator"],
  "app/(app)/units/unit-actions.ts#editUnitAction": ["admin", "qa"],
  "app/(app)/units/unit-actions.ts#retireUnitAction": ["admin", "qa"],
  "app/(app)/units/[id]/actions.ts#addNote": ["admin", "qa", "operator"],
  // Password links work without a session: the token in the form is the authority.
  "app/(auth)/forgot-password/actions.ts#requestPasswordReset": ["admin", "qa", "operator", "kestrum"],
  "app/(auth)/set-password/actions.ts#setPassword": ["admin", "qa", "operator", "kestrum"],
  "app/(app)/captures/[id]/instrument-actions.ts#confirmOverdueAction": ["qa"],
};
/** Actions of whole files given to the same roles. */
const ALLOWED_BY_FILE: Record<string, readonly Role[]> = {
  "app/(app)/ratings/actions.ts": ["admin", "qa"],
  "app/(app)/stations/actions.ts": ["admin"],
  "app/(app)/admin/clients/actions.ts": ["admin"],
  "app/(app)/admin/people/actions.ts": ["admin"],
  "app/(app)/units/[id]/actions.ts": ["admin", "qa"],
  "app/(app)/review/actions.ts": ["admin", "qa"],
  "app/(app)/units/[id]/attachment-actions.ts": ["admin", "qa"],
  "app/(app)/units/[id]/record-actions.ts": ["admin", "qa"],
  "app/(app)/stations/profile-actions.ts": ["admin", "operator"],
  "app/(app)/admin/instruments/actions.ts": ["admin"],
  "app/(app)/captures/[id]/instrument-actions.ts": ["admin", "qa", "operator"],
  "app/(app)/account/prefs-actions.ts": ["admin", "qa", "operator", "kestrum"],
  "app/(app)/admin/lab/actions.ts": ["admin"],
  "app/(app)/portal/tokens/actions.ts": ["kestrum"],
  "app/(app)/units/[id]/release-actions.ts": ["admin", "qa"],
};
const ROLES: readonly Role[] = ["admin", "qa", "operator", "kestrum"];

type Action = { id: string; key: string; path: string };

/** The address of a page that uses the action ("app/(app)/units/[id]/page" -> /units/<any id>). */
function pagePath(worker: string): string {
  const route = worker.replace(/^app/, "").replace(/\/page$/, "").replace(/\/\([^)]*\)/g, "").replace(/\[[^\]]+\]/g, "00000000-0000-4000-8000-000000000000");
  return route === "" ? "/" : route;
}

function builtActions(): Action[] {
  // scripts/test.sh builds the app under test into .next-test (EMFOLIO_DIST_DIR).
  const dist = ".next-test";
  const manifest = JSON.parse(readFileSync(path.join(dist, "server", "server-reference-manifest.json"), "utf8")) as {
    node: Record<string, { filename?: string; exportedName?: string; workers: Record<string, unknown> }>;
  };
  return Object.entries(manifest.node).map(([id, entry]) => ({
    id, key: `${entry.filename ?? "?"}#${entry.exportedName ?? "?"}`, path: pagePath(Object.keys(entry.workers)[0] ?? "app/page"),
  }));
}

function allowedRoles(key: string): readonly Role[] | undefined {
  return ALLOWED[key] ?? ALLOWED_BY_FILE[key.split("#")[0] ?? ""];
}

/** A direct call as Next's client makes it: the action id in a header, the arguments as a JSON array. */
async function post(request: APIRequestContext, baseURL: string, action: Action) {
  return request.post(action.path, {
    headers: { "Next-Action": action.id, Origin: baseURL, "Content-Type": "text/plain;charset=UTF-8", Accept: "text/x-component" },
    data: "[]", maxRedirects: 0, failOnStatusCode: false,
  });
}

test("every server action of the build has a decided list of roles", () => {
  const actions = builtActions();
  expect(actions.length).toBeGreaterThan(10);
  expect(actions.filter((a) => !allowedRoles(a.key)).map((a) => a.key)).toEqual([]);
});

for (const role of ROLES) {
  test(`server actions POSTed directly as ${role}: every forbidden one is refused before it does anything`, async ({ page, baseURL }) => {
    test.setTimeout(120_000);
    await signIn(page, role);
    const refusedSeen: string[] = [];
    for (const action of builtActions()) {
      const allowed = allowedRoles(action.key) ?? [];
      if (allowed.includes(role)) continue;
      const res = await post(page.request, baseURL ?? "", action);
      const location = res.headers()["location"] ?? "";
      const body = res.status() === 200 ? await res.text() : "";
      // Refused: 403 (forbidden()); 409 when the path rules already refused the page (proxy.ts rewrites
      // it to /refused, where Next finds no such action, so the action's code never runs); or a redirect
      // to the access-denied or sign-in page (inside the RSC payload of a 200, as Next answers a redirect
      // from an action).
      const refused = res.status() === 403 || res.status() === 409 || /access-denied|sign-in/.test(location) || /NEXT_REDIRECT;[^;]*;\/(access-denied|sign-in)|NEXT_HTTP_ERROR_FALLBACK;403/.test(body);
      expect(refused, `${action.key} as ${role}: status ${res.status()} ${location} ${body.slice(0, 200)}`).toBe(true);
      refusedSeen.push(action.key);
    }
    if (role === "kestrum") expect(refusedSeen.length).toBeGreaterThan(10);
  });
}

/** Actions that take no arguments and would end the caller's own session: left out of the malformed-call test. */
const NO_ARGUMENTS = new Set(["app/(app)/account/actions.ts#endOtherSessionsAction", "app/(app)/account/actions.ts#signOutEverywhereAction"]);

for (const role of ROLES) {
  test(`server actions POSTed directly as ${role} with malformed arguments: the allowed ones answer without a server error`, async ({ page, baseURL }) => {
    test.setTimeout(120_000);
    await signIn(page, role);
    for (const action of builtActions()) {
      if (!(allowedRoles(action.key) ?? []).includes(role) || NO_ARGUMENTS.has(action.key)) continue;
      const res = await post(page.request, baseURL ?? "", action);
      expect(res.status(), `${action.key} as ${role}`).toBeLessThan(500);
    }
  });
}
