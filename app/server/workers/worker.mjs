// Entry of the worker threads (piscina, app/lib/pool.server.ts). The tasks are TypeScript, so the
// thread registers tsx first, as the host process does with `--import tsx`. workerData names the
// task module: the password pool's threads never load the roof engine.
import path from "node:path";
import { workerData } from "node:worker_threads";
import { register } from "tsx/esm/api";

register({ tsconfig: path.resolve(import.meta.dirname, "../../../tsconfig.json") });
const tasks =
  workerData?.tasks === "password" ? await import("./password-tasks.ts") : await import("./engine-tasks.ts");

export default tasks.runTask;
