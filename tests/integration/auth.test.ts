import { randomUUID } from "node:crypto";
import { afterAll, describe, expect, it } from "vitest";
import { closeDb } from "@/db/queries/connection";
import { clearFailures } from "@/db/queries/sign-in-attempts";
import { DEMO_PASSWORD } from "@/db/seed-data";
import { authenticate } from "@/lib/auth/authenticate";
import { getEnv } from "@/lib/server/env";

afterAll(closeDb);

describe("authenticate(email, password, address)", () => {
  it("signs in a seeded account with its role and organisation, ignoring email case", async () => {
    const result = await authenticate("Ines.Vardy@Harrowgate.example", DEMO_PASSWORD, "10.0.0.1");
    expect(result.ok).toBe(true);
    if (result.ok) {
      expect(result.user.role).toBe("qa");
      expect(result.user.organisationKind).toBe("lab");
      expect(result.user).not.toHaveProperty("passwordHash");
    }
  });

  it("refuses a wrong password with a message that does not reveal whether the account exists", async () => {
    const wrong = await authenticate("ines.vardy@harrowgate.example", "not-the-password", `t-${randomUUID()}`);
    const nobody = await authenticate(`nobody-${randomUUID()}@example.invalid`, "whatever", `t-${randomUUID()}`);
    expect(wrong).toEqual({ ok: false, message: expect.stringContaining("do not match") });
    expect(nobody).toEqual(wrong);
  });

  it("authenticate never locks an account: after SIGN_IN_MAX_ATTEMPTS failures from many addresses the right password still signs in", async () => {
    const email = "sela.ambrose@poldane.example";
    const limit = getEnv().SIGN_IN_MAX_ATTEMPTS;
    for (let i = 0; i < limit; i++) await authenticate(email, "wrong", `a-${i}-${randomUUID()}`);
    const owner = await authenticate(email, DEMO_PASSWORD, `a-${randomUUID()}`);
    expect(owner.ok).toBe(true);
    await clearFailures(email);
  }, 30_000);

  it("limits one client address across accounts", async () => {
    const address = `shared-${randomUUID()}`;
    const limit = getEnv().SIGN_IN_MAX_ATTEMPTS * 4;
    for (let i = 0; i < limit; i++) await authenticate(`guess-${i}@example.invalid`, "wrong", address);
    const result = await authenticate("tobiah.crane@harrowgate.example", DEMO_PASSWORD, address);
    expect(result.ok).toBe(false);
    const elsewhere = await authenticate("tobiah.crane@harrowgate.example", DEMO_PASSWORD, `other-${randomUUID()}`);
    expect(elsewhere.ok).toBe(true);
  });
});
