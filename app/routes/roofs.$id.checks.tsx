/** /roofs/:id/checks: a roof's as-built checks, and a new one from the joist-by-joist form or a CSV. */
import { data, Link, redirect } from "react-router";
import type { Route } from "./+types/roofs.$id.checks";
import { requirePermission } from "~/lib/auth.server";
import { getRoofFor } from "~/lib/roofs.server";
import { checkAccess } from "~/lib/permissions";
import { listChecks, insertCheck, runCheck, shapeStored } from "~/lib/as-built-checks.server";
import { checkMetaSchema } from "~/lib/as-built-check";
import { measurePlaces, parseMeasuredSchedule, readLevel } from "~/lib/pack/measured-schedule";
import { alignSurvey, referenceSchema } from "~/lib/survey-align";
import { parseSurveyCsv } from "~/lib/survey-csv";
import { designLevelAt } from "~/engine";
import { GeneralErrorBoundary } from "~/components/error-boundary";
import { MeasuredForm, type CheckFormErrors } from "~/components/as-built/measured-form";
import { CheckList } from "~/components/as-built/check-list";

export const meta: Route.MetaFunction = ({ data }) => [
  { title: `${data?.roof.name ?? "Roof"} · as-built checks · Fallwright` },
];

/** Largest uploaded CSV (a measured schedule of a 100 × 100 m roof is about 100 kB). */
const MAX_FILE_BYTES = 512 * 1024;
const MIN_POINTS = 3;

export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requirePermission(request, "roofs:own");
  const roof = await getRoofFor(user, params.id);
  if (!roof || !checkAccess(roof).read) throw data("No roof with that id in your library.", { status: 404 });
  const checks = await listChecks(roof.id);
  let places: { label: string; joist: number; kind: "end" | "check"; at: [number, number]; designMm: number }[] = [];
  let shapeError: string | null = null;
  if (checkAccess(roof).create) {
    const shaped = await shapeStored(roof.spec);
    if (shaped.ok)
      places = measurePlaces(shaped.value.spec, shaped.value.analysis.shaped.joists).map((p) => ({
        label: p.label,
        joist: p.joist,
        kind: p.kind,
        at: [p.at[0], p.at[1]],
        designMm: Math.round(p.design * 1000),
      }));
    else shapeError = shaped.message;
  }
  const outline = Array.isArray((roof.spec as { outline?: unknown })?.outline)
    ? ((roof.spec as { outline: [number, number][] }).outline as [number, number][])
    : [];
  return {
    roof: { id: roof.id, name: roof.name, version: roof.version, canEdit: roof.canEdit, outline },
    checks,
    places,
    shapeError,
    today: new Date().toISOString().slice(0, 10),
  };
}

type Values = Record<string, string>;

function fail(status: number, errors: CheckFormErrors, values: Values) {
  return data({ errors, values }, { status });
}

export async function action({ request, params }: Route.ActionArgs) {
  const user = await requirePermission(request, "roofs:own");
  const roof = await getRoofFor(user, params.id);
  if (!roof || !checkAccess(roof).read) throw data("No roof with that id in your library.", { status: 404 });
  if (!checkAccess(roof).create) throw data("Only the roof's owner can add an as-built check.", { status: 403 });
  let form: FormData;
  try {
    form = await request.formData();
  } catch {
    return fail(400, { form: "The form could not be read: send it again." }, {});
  }
  // Everything typed comes back on an error, so nothing is lost.
  const values: Values = {};
  for (const [k, v] of form.entries()) if (typeof v === "string" && k.length <= 80) values[k] = v.slice(0, 200);
  const intent = form.get("intent");
  if (intent !== "form" && intent !== "upload")
    return fail(400, { form: 'The field "intent" must be form or upload.' }, values);
  const meta = checkMetaSchema.safeParse(values);
  const errors: CheckFormErrors = {};
  if (!meta.success) for (const i of meta.error.issues) errors[String(i.path[0] ?? "form")] ??= i.message;

  const shaped = await shapeStored(roof.spec);
  if (!shaped.ok) return fail(shaped.status, { form: shaped.message }, values);
  const { spec, analysis } = shaped.value;
  const places = measurePlaces(spec, analysis.shaped.joists);
  let points: { at: [number, number]; level: number; label?: string }[] = [];

  if (intent === "upload") {
    const file = form.get("file");
    if (!(file instanceof File) || file.size === 0) errors.file = "Choose a CSV file to upload.";
    else if (file.size > MAX_FILE_BYTES) errors.file = `The file is over ${MAX_FILE_BYTES / 1024} kB.`;
    else {
      const text = await file.text();
      if (/^\s*"?joist"?,/m.test(text)) {
        const parsed = parseMeasuredSchedule(text, spec, analysis.shaped.joists);
        for (const e of parsed.entries) if (e.raw !== "") values[`level:${e.label}`] = e.raw;
        if (parsed.units === "us")
          for (const e of parsed.entries)
            if (e.level !== null) values[`level:${e.label}`] = String(Math.round(e.level * 10000) / 10);
        if (!parsed.ok)
          errors.file = parsed.issues
            .slice(0, 20)
            .map((i) => i.message)
            .join("\n");
        points = parsed.points.map((p) => ({ at: [p.at[0], p.at[1]], level: p.level, label: p.label }));
      } else {
        // A survey: x, y, level, in the roof's coordinates or placed by two reference points.
        const ref = referenceSchema.safeParse(values);
        if (!ref.success) for (const i of ref.error.issues) errors[String(i.path[0] ?? "form")] ??= i.message;
        else {
          const design = designLevelAt(spec);
          const survey = parseSurveyCsv(text);
          if (!survey.ok)
            errors.file = survey.issues
              .slice(0, 20)
              .map((i) => i.message)
              .join("\n");
          else {
            const aligned = alignSurvey(survey.points, ref.data);
            if (!aligned.ok) errors[aligned.field] = aligned.message;
            else {
              points = aligned.points;
              const outside = points.findIndex((p) => design(p.at) === null);
              if (outside >= 0)
                errors.file = `Row ${survey.points[outside].row}: the point lands outside the roof outline at (${points[outside].at[0].toFixed(2)}, ${points[outside].at[1].toFixed(2)}) m: check the reference points.`;
            }
          }
        }
      }
    }
  } else {
    const byLabel = new Map(places.map((p) => [p.label, p]));
    for (const [key, raw] of Object.entries(values)) {
      if (!key.startsWith("level:") || raw.trim() === "") continue;
      const label = key.slice(6);
      const place = byLabel.get(label);
      if (!place) {
        errors.form ??= `"${label.slice(0, 20)}" is not a joist end or check point of this roof (the roof changed since the form was opened?).`;
        continue;
      }
      const v = readLevel(raw, "metric");
      if (typeof v === "string") errors[key] = `${raw.slice(0, 20)} ${v}.`;
      else if (Math.abs(v - place.design) > 0.05 && Math.abs(v / 10 - place.design) <= 0.01)
        errors[key] =
          `${raw} mm is 10× the design level ${Math.round(place.design * 1000)} mm: check the decimal point.`;
      else if (Math.abs(v) > 10) errors[key] = `${raw} mm is over 10 m from the datum.`;
      else points.push({ at: [place.at[0], place.at[1]], level: v, label });
    }
  }
  if (!errors.file && !Object.keys(errors).some((k) => k.startsWith("level:")) && points.length < MIN_POINTS)
    errors.form ??= `Enter at least ${MIN_POINTS} measured levels (${points.length} so far).`;
  if (Object.keys(errors).length || !meta.success) return fail(400, errors, values);

  const checked = await runCheck(spec, points, {
    deviation: meta.data.deviationMm / 1000,
    pondDepth: meta.data.pondDepthMm / 1000,
  });
  if (!checked.ok) return fail(checked.status === 503 ? 503 : 422, { form: checked.message }, values);
  const id = await insertCheck({
    roofId: roof.id,
    roofVersion: roof.version,
    spec,
    meta: meta.data,
    points,
    result: checked.value,
    source: intent === "upload" ? "csv" : "form",
    userId: user.id,
  });
  return redirect(`/roofs/${roof.id}/checks/${id}?saved=1`);
}

export default function RoofChecks({ loaderData, actionData }: Route.ComponentProps) {
  const { roof, checks, places, shapeError, today } = loaderData;
  const answer = actionData;
  return (
    <div className="mx-auto max-w-5xl space-y-6">
      <header className="space-y-1">
        <p className="text-sm">
          <Link to={`/roofs/${roof.id}`}>← {roof.name}</Link>
        </p>
        <h1 className="text-2xl font-bold tracking-tight sm:text-3xl">As-built checks</h1>
        <p className="text-sm text-ink-soft">
          Levels measured on the deck before the membrane goes down, compared with this roof&apos;s design.
        </p>
      </header>
      <CheckList roofId={roof.id} checks={checks} />
      {roof.canEdit ? (
        shapeError ? (
          <p role="alert" className="card">
            {shapeError}
          </p>
        ) : (
          <MeasuredForm
            roofId={roof.id}
            version={roof.version}
            places={places}
            outline={roof.outline}
            today={today}
            errors={answer?.errors}
            values={answer?.values}
          />
        )
      ) : (
        <p className="text-sm text-ink-soft">Only the roof&apos;s owner can add a check.</p>
      )}
    </div>
  );
}

export function ErrorBoundary() {
  return <GeneralErrorBoundary />;
}
