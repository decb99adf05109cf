import { describe, expect, it } from "vitest";
import { useTestDatabase } from "../support/db";
import { listUsers } from "~/lib/users.server";

// Issue 13: the admin users list asks for each user's last sign-in; with `audit_log` indexed on
// `at` only, PostgreSQL read the whole log for every user listed.
const database = useTestDatabase();

interface PlanNode {
  "Node Type": string;
  "Relation Name"?: string;
  "Index Cond"?: string;
  Plans?: PlanNode[];
}

function nodes(plan: PlanNode): PlanNode[] {
  return [plan, ...(plan.Plans ?? []).flatMap(nodes)];
}

describe("admin users list query plan", () => {
  it("finds each user's last sign-in through an index by subject, never by walking audit_log", async () => {
    const k = database.db();
    const { organisation_id: organisationId } = (await k("users")
      .where({ email: "admin@tidemark.example" })
      .first("organisation_id"))!;
    // A log of a busy year: 60,000 entries over the organisation's users, a third of them sign-ins.
    await k.raw(
      `insert into audit_log (subject_id, actor_id, action, ip, at)
       select u.ids[1 + (i % array_length(u.ids, 1))], null,
              case when i % 3 = 0 then 'sign_in' when i % 3 = 1 then 'roof_saved' else 'sign_in_failed' end,
              '192.0.2.' || (i % 200), now() - i * interval '5 minutes'
         from generate_series(1, 60000) i,
              (select array_agg(id) as ids from users where organisation_id = ?) u`,
      [organisationId],
    );
    await k.raw("analyze audit_log");

    const seen: { sql: string; bindings: unknown[] }[] = [];
    const listen = (q: { sql: string; bindings?: unknown[] }) => seen.push({ sql: q.sql, bindings: q.bindings ?? [] });
    k.on("query", listen);
    const { rows } = await listUsers({ organisationId });
    k.off("query", listen);
    expect(rows.length).toBeGreaterThan(3);
    expect(rows.some((r) => r.lastSignInAt)).toBe(true);

    const query = seen.find((q) => q.sql.includes("lastSignInAt"));
    expect(query, "the list's query was not seen").toBeTruthy();
    // The same SQL (already in PostgreSQL's $n form) and values, through the driver.
    const native = query!.sql;
    const scansOfLog = async () => {
      const conn = (await k.client.acquireConnection()) as {
        query: (sql: string, values: unknown[]) => Promise<{ rows: Record<string, unknown>[] }>;
      };
      try {
        const { rows: explained } = await conn.query(`explain (format json) ${native}`, query!.bindings);
        const plan = (explained[0]["QUERY PLAN"] as { Plan: PlanNode }[])[0].Plan;
        // How each read of the log finds its rows: by subject through an index, or by walking it.
        return nodes(plan)
          .filter((n) => n["Relation Name"] === "audit_log")
          .map((n) =>
            n["Node Type"].startsWith("Index") && /subject_id/.test(n["Index Cond"] ?? "")
              ? "by subject"
              : `walks the log (${n["Node Type"]})`,
          );
      } finally {
        await k.client.releaseConnection(conn);
      }
    };
    const withIndex = await scansOfLog();
    expect(withIndex.length).toBeGreaterThan(0);
    expect(
      withIndex.every((s) => s === "by subject"),
      withIndex.join(", "),
    ).toBe(true);
    // The check itself can fail: without the index (as before it) the plan walks the log, in
    // a sequential scan or backwards through the index on `at` until a user's sign-in turns up.
    await k.raw("drop index audit_log_subject_action_at");
    expect((await scansOfLog()).some((s) => s.startsWith("walks the log"))).toBe(true);
  }, 60_000);
});
