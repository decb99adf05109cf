/**
 * Demo data for "Tidemark Membrane School", an invented training centre. Idempotent: running it
 * again adds what is missing and changes nothing else. All names, places and roofs are invented.
 */
import bcrypt from "bcryptjs";
import type { Knex } from "knex";

export const DEMO_PASSWORD = "fallwright-demo";
const ORG_NAME = "Tidemark Membrane School";

const USERS = [
  { email: "admin@tidemark.example", name: "Ada Marrow", role: "admin" },
  { email: "trainer@tidemark.example", name: "Tomas Verrall", role: "trainer" },
  { email: "trainer2@tidemark.example", name: "Rina Okafor-Bell", role: "trainer" },
  { email: "designer@tidemark.example", name: "Deniz Halloway", role: "designer" },
  { email: "trainee@tidemark.example", name: "Tess Quinlan", role: "trainee" },
  { email: "trainee2@tidemark.example", name: "Marco Ellery", role: "trainee" },
  { email: "trainee3@tidemark.example", name: "Priya Santhorn", role: "trainee" },
  { email: "trainee4@tidemark.example", name: "Jonah Whitcombe", role: "trainee" },
] as const;

/** Invented buildings. Plan in metres; outlets on parapet edges. */
export const DEMO_ROOFS = [
  {
    name: "Library annex, Harrow Lane",
    owner: "designer@tidemark.example",
    spec: {
      outline: [
        [0, 0],
        [18, 0],
        [18, 9],
        [0, 9],
      ],
      outlets: [{ at: [9, 0] }],
      baseFall: "1:60",
      joists: { spacing: 0.4 },
      minFall: "1:100",
    },
  },
  {
    name: "Shop roofs 4-8, Quayside Row",
    owner: "designer@tidemark.example",
    spec: {
      outline: [
        [0, 0],
        [24, 0],
        [24, 7.5],
        [0, 7.5],
      ],
      outlets: [{ at: [6, 0] }, { at: [18, 0] }],
      baseFall: "1:60",
      joists: { spacing: 0.4 },
    },
  },
  {
    name: "L-shaped clinic, Fernbrook",
    owner: "trainer@tidemark.example",
    spec: {
      outline: [
        [0, 0],
        [20, 0],
        [20, 8],
        [8, 8],
        [8, 16],
        [0, 16],
      ],
      outlets: [{ at: [4, 0] }, { at: [16, 0] }],
      baseFall: "1:60",
      joists: { spacing: 0.4 },
    },
  },
  {
    name: "Deck over garage, 11 Saltmarsh Close",
    owner: "trainee@tidemark.example",
    spec: {
      outline: [
        [0, 0],
        [6, 0],
        [6, 5],
        [0, 5],
      ],
      edges: ["parapet", "parapet", "eaves", "parapet"],
      outlets: [],
      baseFall: "1:60",
      joists: { spacing: 0.4 },
    },
  },
] as const;

export async function seed(knex: Knex): Promise<void> {
  let org = await knex("organisations").where({ name: ORG_NAME }).first();
  if (!org) [org] = await knex("organisations").insert({ name: ORG_NAME }).returning("*");

  const hash = await bcrypt.hash(DEMO_PASSWORD, 10);
  const ids: Record<string, string> = {};
  for (const u of USERS) {
    const existing = await knex("users").whereRaw("lower(email) = ?", [u.email]).first();
    if (existing) {
      ids[u.email] = existing.id;
      continue;
    }
    const [row] = await knex("users")
      .insert({ ...u, organisation_id: org.id, password_hash: hash, password_changed_at: knex.fn.now() })
      .returning("id");
    ids[u.email] = row.id;
  }

  for (const r of DEMO_ROOFS) {
    const ownerId = ids[r.owner];
    const found = await knex("roofs").where({ owner_id: ownerId, name: r.name }).first();
    if (found) continue;
    await knex.transaction(async (trx) => {
      const [roof] = await trx("roofs")
        .insert({ owner_id: ownerId, name: r.name, spec: JSON.stringify(r.spec), shared: true })
        .returning("id");
      await trx("roof_versions").insert({
        roof_id: roof.id,
        version: 1,
        name: r.name,
        spec: JSON.stringify(r.spec),
        saved_by: ownerId,
      });
    });
  }

  const trainerId = ids["trainer@tidemark.example"];
  let cls = await knex("classes").where({ trainer_id: trainerId, name: "Parapet roofs, spring cohort" }).first();
  if (!cls) {
    [cls] = await knex("classes")
      .insert({
        organisation_id: org.id,
        trainer_id: trainerId,
        name: "Parapet roofs, spring cohort",
        starts_on: "2027-03-01",
        ends_on: "2027-03-05",
        venue: "Tidemark training hall, bay 2",
      })
      .returning("*");
  }
  for (const email of ["trainee@tidemark.example", "trainee2@tidemark.example", "trainee3@tidemark.example"]) {
    await knex("class_members")
      .insert({ class_id: cls.id, user_id: ids[email] })
      .onConflict(["class_id", "user_id"])
      .ignore();
  }
}
