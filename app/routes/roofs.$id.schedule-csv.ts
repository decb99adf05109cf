import type { Route } from "./+types/roofs.$id.schedule-csv";
import { SCHEDULE_CSV, roofPackResponse } from "~/lib/pack/download.server";

/** GET /roofs/:id/schedule.csv: the saved roof's drop schedule, for whoever may read the roof. */
export const loader = ({ request, params }: Route.LoaderArgs) => roofPackResponse(request, params.id, SCHEDULE_CSV);
