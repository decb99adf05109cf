import { describe, expect, it } from "vitest";
import { useTestDatabase } from "../support/db";
import type { RoofSpec } from "~/engine";
import type { SessionUser } from "~/lib/auth.server";
import { AUTOSAVE_COALESCE_MINUTES, createRoof, restoreVersion, updateRoof } from "~/lib/roofs.server";

// Issue 13: every autosave used to add a full roof_versions row forever.
const database = useTestDatabase();

const spec = (fall: string): RoofSpec => ({
  outline: [
    [0, 0],
    [12, 0],
    [12, 8],
    [0, 8],
  ],
  outlets: [{ at: [6, 0] }],
  baseFall: fall,
});

async function designer(): Promise<SessionUser> {
  const u = await database
    .db()("users")
    .where({ email: "designer@tidemark.example" })
    .first("id", "email", "name", "role", "organisation_id");
  return { id: u!.id, email: u!.email, name: u!.name, role: u!.role, organisationId: u!.organisation_id };
}

async function history(id: string) {
  return database.db()("roof_versions").where({ roof_id: id }).orderBy("version").select("version", "kind", "name");
}

describe("roof history", () => {
  it("coalesces autosaves within a few minutes into one version, and keeps created, named and restored ones", async () => {
    const user = await designer();
    const { id } = await createRoof(user, { name: "Depot canopy", spec: spec("1:60") });
    let version = 1;
    const save = async (input: { name?: string; spec?: RoofSpec }) => {
      const r = await updateRoof(user, id, { ...input, version });
      if (r.status !== "ok") throw new Error(r.status);
      version = r.version;
    };
    // Twelve autosaves in a row: one row for all of them, holding the last.
    for (let i = 0; i < 12; i++) await save({ spec: spec(`1:${50 + i}`) });
    expect(await history(id)).toEqual([
      { version: 1, kind: "created", name: "Depot canopy" },
      { version: 13, kind: "auto", name: "Depot canopy" },
    ]);
    const latest = await database.db()("roof_versions").where({ roof_id: id, version: 13 }).first("spec");
    expect((latest!.spec as { baseFall: string }).baseFall).toBe("1:61");

    // A named save is kept, and the autosave after it starts a new row.
    await save({ name: "Depot canopy, scheme B" });
    await save({ spec: spec("1:45") });
    await save({ spec: spec("1:44") });
    expect((await history(id)).map((r) => [r.version, r.kind])).toEqual([
      [1, "created"],
      [13, "auto"],
      [14, "named"],
      [16, "auto"],
    ]);

    // An autosave more than the window after the last one is a new version.
    await database
      .db()("roof_versions")
      .where({ roof_id: id, version: 16 })
      .update({ saved_at: database.db().raw(`now() - make_interval(mins => ?)`, [AUTOSAVE_COALESCE_MINUTES + 1]) });
    await save({ spec: spec("1:43") });
    expect((await history(id)).map((r) => r.version)).toEqual([1, 13, 14, 16, 17]);

    // A restored version is kept, and is not overwritten by the autosave that follows.
    const restored = await restoreVersion(user, id, 1, version);
    expect(restored.status).toBe("ok");
    if (restored.status === "ok") version = restored.version;
    await save({ spec: spec("1:42") });
    expect((await history(id)).map((r) => [r.version, r.kind])).toEqual([
      [1, "created"],
      [13, "auto"],
      [14, "named"],
      [16, "auto"],
      [17, "auto"],
      [18, "restored"],
      [19, "auto"],
    ]);
  });
});
