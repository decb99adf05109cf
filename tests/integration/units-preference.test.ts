import { describe, expect, it } from "vitest";
import { useTestDatabase } from "../support/db";
import { callRoute, formPost, get, sessionCookie } from "../support/accounts";
import * as account from "~/routes/account";
import { getOptionalUser } from "~/lib/auth.server";

const database = useTestDatabase();

describe("units preference (per user; roofs stay in metres)", () => {
  it("starts unset (follow the rule set), saves US customary and metric, goes back to auto, and is read with the session", async () => {
    const cookie = await sessionCookie("designer@tidemark.example");
    expect((await getOptionalUser(get("/", cookie)))?.units).toBeNull();

    const us = await callRoute(account.action, formPost("/account", { intent: "units", units: "us" }, cookie));
    expect(us.status).toBe(200);
    expect(us.data).toMatchObject({ intent: "units", message: "Your units are saved." });
    expect((await getOptionalUser(get("/", cookie)))?.units).toBe("us");

    await callRoute(account.action, formPost("/account", { intent: "units", units: "metric" }, cookie));
    expect((await getOptionalUser(get("/", cookie)))?.units).toBe("metric");

    await callRoute(account.action, formPost("/account", { intent: "units", units: "auto" }, cookie));
    const row = await database.db()("users").whereRaw("lower(email) = ?", ["designer@tidemark.example"]).first("units");
    expect(row!.units).toBeNull();
  });

  it("refuses an unknown system with 400 naming the field, and the database refuses it too", async () => {
    const cookie = await sessionCookie("trainee@tidemark.example");
    const bad = await callRoute(account.action, formPost("/account", { intent: "units", units: "imperial" }, cookie));
    expect(bad.status).toBe(400);
    expect(bad.data).toMatchObject({
      intent: "units",
      fieldErrors: { units: expect.stringMatching(/metric|US customary/) },
    });
    await expect(
      database.db()("users").whereRaw("lower(email) = ?", ["trainee@tidemark.example"]).update({ units: "imperial" }),
    ).rejects.toThrow(/users_units_check/);
  });
});
