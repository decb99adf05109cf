/**
 * Brings the demo accounts' password hashes up to the app's bcrypt cost (12), so a wrong password
 * for a demo account takes as long as one for an unknown address. Idempotent: only hashes below
 * cost 12 that still match the demo password are replaced.
 */
import bcrypt from "bcryptjs";
import type { Knex } from "knex";
import { DEMO_PASSWORD } from "./01_demo.ts";

const COST = 12;

export async function seed(knex: Knex): Promise<void> {
  const rows: { id: string; password_hash: string }[] = await knex("users")
    .whereRaw("lower(email) like '%@tidemark.example'")
    .whereRaw("password_hash ~ '^\\$2[aby]\\$(0[0-9]|1[01])\\$'")
    .select("id", "password_hash");
  if (!rows.length) return;
  const hash = await bcrypt.hash(DEMO_PASSWORD, COST);
  for (const r of rows) {
    if (await bcrypt.compare(DEMO_PASSWORD, r.password_hash))
      await knex("users").where({ id: r.id }).update({ password_hash: hash });
  }
}
