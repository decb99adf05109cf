import type { Route } from "./+types/sandbox.schedule-csv";
import { SCHEDULE_CSV, sandboxPackGet, sandboxPackResponse } from "~/lib/pack/download.server";

export const loader = () => sandboxPackGet(SCHEDULE_CSV);

/** POST /sandbox/schedule.csv: the posted roof's drop schedule as a CSV attachment. */
export const action = ({ request, context }: Route.ActionArgs) => sandboxPackResponse(request, SCHEDULE_CSV, context);
