/** bcrypt (about 300 ms of CPU at cost 12) in a worker thread of the password pool (app/lib/pool.server.ts). */
import bcrypt from "bcryptjs";
import type { PoolResult, PoolTask } from "../../lib/pool-tasks";

export async function runTask(task: PoolTask): Promise<PoolResult> {
  const started = performance.now();
  switch (task.kind) {
    case "hash":
      return { kind: "text", text: await bcrypt.hash(task.password, task.cost), ms: performance.now() - started };
    case "compare":
      return {
        kind: "boolean",
        value: await bcrypt.compare(task.password, task.hash),
        ms: performance.now() - started,
      };
    default:
      throw new Error(`the password pool does not run ${task.kind} tasks`);
  }
}
