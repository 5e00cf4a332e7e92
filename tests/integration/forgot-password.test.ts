import { randomUUID } from "node:crypto";
import { afterAll, beforeEach, describe, expect, it, vi } from "vitest";
import { closeDb } from "@/db/queries/connection";
import { findActiveUserByEmail, insertUser } from "@/db/queries/users";

// Forgot-password: the answer never depends on whether the account exists (the lookup and the mail run
// after the answer, through next/server `after`), and one client address is limited to 10 an hour.

const deferred: Array<() => Promise<unknown> | unknown> = [];
vi.mock("next/server", () => ({ after: (task: () => unknown) => void deferred.push(task) }));
const sent: string[] = [];
vi.mock("@/lib/auth/password-links", async (original) => {
  const real = await original<typeof import("@/lib/auth/password-links")>();
  return {
    ...real,
    sendPasswordLink: async (...args: Parameters<typeof real.sendPasswordLink>) => {
      sent.push(args[0].email);
      return real.sendPasswordLink(...args);
    },
  };
});
const { acceptPasswordResetRequest } = await import("@/lib/dal/password-link");

afterAll(closeDb);
beforeEach(() => {
  deferred.length = 0;
  sent.length = 0;
});

const runDeferred = async () => {
  for (const task of deferred.splice(0)) await task();
};

describe("acceptPasswordResetRequest(email, address)", () => {
  it("answers an existing and an unknown account alike, before either is looked up; only the existing one is mailed afterwards", async () => {
    const address = `fp-${randomUUID()}`;
    const existing = await acceptPasswordResetRequest("tobiah.crane@harrowgate.example", address);
    const unknown = await acceptPasswordResetRequest(`nobody-${randomUUID()}@example.invalid`, address);
    expect([existing, unknown]).toEqual([true, true]);
    // Nothing about either account was done before the answer: both tasks are still pending.
    expect(deferred).toHaveLength(2);
    expect(sent).toEqual([]);
    await runDeferred();
    expect(sent).toEqual(["tobiah.crane@harrowgate.example"]);
  });

  it("refuses the 11th request of one address within the hour, without deferring any work; another address is unaffected", async () => {
    const address = `fp-${randomUUID()}`;
    const answers: boolean[] = [];
    for (let i = 0; i < 11; i++) answers.push(await acceptPasswordResetRequest(`nobody-${i}-${randomUUID()}@example.invalid`, address));
    expect(answers.slice(0, 10).every(Boolean)).toBe(true);
    expect(answers[10]).toBe(false);
    expect(deferred).toHaveLength(10);
    expect(await acceptPasswordResetRequest(`nobody-${randomUUID()}@example.invalid`, `fp-${randomUUID()}`)).toBe(true);
  });

  it("mails one account at most three links an hour, however many addresses ask", async () => {
    const client = await findActiveUserByEmail("sela.ambrose@poldane.example");
    const email = `fp-${randomUUID()}@poldane.example`;
    await insertUser({ email, name: "Forgetful Tester", role: "manufacturer", organisationId: client!.organisationId, passwordHash: "x" });
    for (let i = 0; i < 5; i++) {
      await acceptPasswordResetRequest(email, `fp-${randomUUID()}`);
      await runDeferred();
    }
    expect(sent).toEqual([email, email, email]);
  });
});
