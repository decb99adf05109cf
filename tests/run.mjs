// `npm test`: installs what is missing, then runs every suite (see tests/support/run-all.ts).
import { ensureDependencies, runTs } from "../app/dev/bootstrap.mjs";

ensureDependencies();
process.exit(runTs("tests/support/run-all.ts", process.argv.slice(2)));
