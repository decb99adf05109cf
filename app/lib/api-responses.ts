/**
 * The answers of /api/v1 as zod schemas, for the OpenAPI document (app/lib/openapi.server.ts).
 * Requests are described by the very schemas the routes validate with; these describe what the
 * routes send back, and the API tests check every response they receive against them
 * (tests/support/openapi.ts), so a change to an answer that is not made here fails a test.
 * API objects are strict (no keys beyond these); the analysis allows added keys, as its
 * contract says (docs/roof-method.md §9), but every key listed must be there with its type.
 */
import { z } from "zod";
import { RULE_SET_IDS, type Warning as EngineWarning } from "~/engine";
import { underlaySettingsSchema } from "~/lib/roof-file";

/** Stands for the engine's roof spec; the document fills the component from the engine's schema. */
export const roofSpecRef = z.unknown().meta({ id: "RoofSpec" });

const point = z.tuple([z.number(), z.number()]).meta({ id: "Point", description: "A plan point [x, y] in metres." });
/** JSON writes Infinity (a level piece) as null. */
const ratio = z.number().nullable();
const isoTime = z.iso.datetime({ offset: true });

export const apiErrorSchema = z
  .strictObject({
    error: z.strictObject({
      message: z.string(),
      issues: z.array(z.strictObject({ path: z.string(), message: z.string() })),
    }),
  })
  .meta({ id: "Error", description: "Every error of the JSON API: a message for people and the fields at fault." });

export const apiIndexSchema = z
  .strictObject({ name: z.string(), version: z.number().int(), endpoints: z.array(z.string()) })
  .meta({ id: "ApiIndex" });

// ---- Analysis (docs/roof-method.md §9) ----

const fall = z
  .object({ ratio: z.number(), degrees: z.number(), percent: z.number(), mmPerM: z.number() })
  .meta({ id: "Fall", description: "A fall as its ratio N (1 in N) and in degrees, percent and mm/m." });

/** Every warning code the engine can give; the type check below fails the build when one is missing. */
const WARNING_CODES = [
  "twist",
  "level-joist",
  "fall-line-too-flat",
  "base-fall-below-rule",
  "high-level-below-derived",
  "ponding",
  "probe-outside",
  "mesh-coarsened",
  "outlet-capacity",
  "narrow-gutter",
  "rainfall-assumed",
  "outlet-parallel-to-joists",
  "water-held-behind-upstand",
  "outlet-off-joist",
] as const satisfies readonly EngineWarning["code"][];
type NoneMissing<T extends never> = T;
/** Fails to compile when the engine gains a warning code this document does not list. */
export type WarningCodesComplete = NoneMissing<Exclude<EngineWarning["code"], (typeof WARNING_CODES)[number]>>;

const warning = z
  .object({
    code: z.enum(WARNING_CODES),
    message: z.string(),
    at: point.optional(),
    size: z.number().optional(),
  })
  .meta({ id: "Warning" });

const fallLine = z
  .object({
    from: point,
    to: point,
    length: z.number(),
    drop: z.number(),
    drainLevel: z.number(),
    ratio,
    fall,
    path: z.array(point),
    drain: z.string(),
  })
  .meta({ id: "FallLine" });

const joist = z
  .object({
    index: z.number().int(),
    offset: z.number(),
    spans: z.array(
      z.object({
        start: point,
        end: point,
        length: z.number(),
        startLevel: z.number(),
        endLevel: z.number(),
        startDrop: z.number(),
        endDrop: z.number(),
        ratio: ratio.describe("The span's own fall 1:N; null when level."),
      }),
    ),
  })
  .meta({ id: "Joist" });

const catchment = z
  .object({
    drain: z.string(),
    kind: z.enum(["outlet", "eaves"]),
    index: z.number().int(),
    label: z.string(),
    area: z.number(),
    flow: z.number().describe("Design flow in L/s, Q = i·A/3600."),
    capacity: z.number().optional(),
  })
  .meta({ id: "Catchment" });

const mesh = z
  .object({
    positions: z.array(z.number()),
    indices: z.array(z.number().int()),
    faceRatio: z.array(ratio),
    faceDrain: z.array(z.number().int()),
  })
  .meta({ id: "Mesh", description: "Only with ?mesh=true." });

const flowTraces = z
  .object({ points: z.array(z.number()), starts: z.array(z.number().int()), ends: z.array(z.string()) })
  .meta({ id: "FlowTraces", description: "Only with ?traces=true." });

export const analysisSchema = z
  .object({
    shaped: z.object({
      highLevel: z.number(),
      highLevelSource: z.enum(["given", "derived"]),
      joistDirection: point,
      edgeFalls: z.array(z.object({ edge: z.number().int(), from: point, to: point, ratio: z.number(), fall })),
      longestFallLine: fallLine.nullable(),
      worstFallRatio: ratio,
      worstFallLine: fallLine.nullable(),
      fallLines: z.array(fallLine),
      joists: z.array(joist),
      fallMap: z.object({
        faces: z.number().int(),
        areaByBand: z.array(z.object({ label: z.string(), minRatio: z.number(), maxRatio: ratio, area: z.number() })),
        flatterThanMinimumArea: z.number(),
        area: z.number(),
      }),
      catchments: z.array(catchment),
      ponding: z.array(z.object({ at: point, area: z.number(), level: z.number() })),
      probes: z.array(z.object({ at: point, level: z.number().nullable() })),
      mesh: mesh.optional(),
      flowTraces: flowTraces.optional(),
    }),
    gutter: z.object({
      comparable: z.boolean(),
      reason: z.string().optional(),
      highLevel: z.number().nullable(),
      lipLevel: z.number().nullable(),
      gutterLength: z.number(),
      soleArea: z.number(),
      detailLength: z.number(),
      width: z.number(),
      depth: z.number(),
      fall,
      narrowGutterOutlets: z.array(z.number().int()),
    }),
    openEdge: z.object({ highLevel: z.number(), edge: z.number().int(), span: z.number() }),
    comparison: z.object({
      heightSaved: z.number().nullable(),
      flattestFall: z.object({ gutter: ratio, shaped: ratio }),
    }),
    advice: z.object({
      minimumBaseFall: z.object({ ratio: z.number(), degrees: z.number(), percent: z.number() }).nullable(),
      extraOutlet: z
        .object({ at: point, edge: z.number().int(), longestFallRatio: ratio, currentLongestFallRatio: ratio })
        .optional(),
    }),
    warnings: z.array(warning),
    baseFall: fall,
    minFall: fall,
    rainfall: z.object({ intensity: z.number(), assumed: z.boolean() }),
    ruleSet: z.object({
      id: z.enum(RULE_SET_IDS as [string, ...string[]]),
      name: z.string(),
      used: z.array(
        z.object({
          key: z.string(),
          value: z.number(),
          unit: z.enum(["ratio", "m", "factor"]),
          document: z.string(),
          clause: z.string().nullable(),
          confidence: z.enum(["page", "memory", "derived", "common practice"]),
          note: z.string().optional(),
          ruleSet: z.enum(RULE_SET_IDS as [string, ...string[]]),
        }),
      ),
    }),
    area: z.number(),
  })
  .meta({
    id: "Analysis",
    description: "The analysis of a roof (docs/roof-method.md §9). Keys may be added; none listed is removed.",
  });

// ---- Roofs ----

const roofSummary = z
  .strictObject({
    id: z.uuid(),
    name: z.string(),
    version: z.number().int(),
    shared: z.boolean(),
    updatedAt: isoTime,
    createdAt: isoTime,
  })
  .meta({ id: "RoofSummary" });

export const roofListSchema = z.strictObject({ roofs: z.array(roofSummary) }).meta({ id: "RoofList" });

export const roofSchema = z
  .strictObject({
    id: z.uuid(),
    name: z.string(),
    version: z.number().int(),
    shared: z.boolean(),
    canEdit: z.boolean(),
    owner: z.strictObject({ id: z.uuid(), name: z.string() }),
    spec: roofSpecRef,
    underlay: underlaySettingsSchema.strict().nullable().meta({ id: "UnderlaySettings" }),
    hasUnderlayImage: z.boolean(),
    createdAt: isoTime,
    updatedAt: isoTime,
  })
  .meta({ id: "Roof" });

export const roofSavedSchema = z.strictObject({ id: z.uuid(), version: z.number().int() }).meta({ id: "RoofSaved" });
export const roofDeletedSchema = z
  .strictObject({ id: z.string(), deleted: z.literal(true) })
  .meta({ id: "RoofDeleted" });
export const roofConflictSchema = z
  .strictObject({
    error: apiErrorSchema.shape.error,
    current: z.strictObject({ version: z.number().int(), name: z.string(), spec: roofSpecRef }),
  })
  .meta({
    id: "RoofConflict",
    description: "Someone saved first: their version, name and spec. Nothing of yours was written.",
  });

// ---- Lessons ----

const lessonSummaryFields = {
  slug: z.string(),
  title: z.string(),
  summary: z.string(),
  minutes: z.number().int(),
  position: z.number().int(),
  version: z.string().describe("SHA-256 of the lesson file."),
  questions: z.number().int(),
  criteria: z.number().int(),
  passMark: z.number(),
};

const progress = z
  .strictObject({
    lesson: z.string(),
    attempts: z.number().int(),
    bestScore: z.number(),
    passed: z.boolean(),
    lastAt: isoTime,
  })
  .meta({ id: "LessonProgress" });

export const lessonListSchema = z
  .strictObject({
    lessons: z.array(
      z.strictObject({
        ...lessonSummaryFields,
        builtIn: z
          .boolean()
          .describe("A lesson of the built-in course (read-only); false: written by your organisation."),
        status: z
          .enum(["draft", "published"])
          .describe("Drafts are listed for their organisation's trainers and admins only."),
        versionNumber: z
          .number()
          .int()
          .nullable()
          .describe("The current version's readable number (v1 is 1); null for a draft never published."),
        progress: progress.nullable().optional().describe("Absent when signed out; null when no attempt yet."),
      }),
    ),
  })
  .meta({ id: "LessonList" });

export const lessonSchema = z
  .strictObject({
    lesson: z.strictObject({
      ...lessonSummaryFields,
      objectives: z.array(z.string()),
      blocks: z.array(
        z.discriminatedUnion("type", [
          z.strictObject({ type: z.literal("html"), html: z.string() }),
          z.strictObject({ type: z.literal("caution"), html: z.string() }),
          z.strictObject({ type: z.literal("roof"), caption: z.string(), view: z.string(), spec: roofSpecRef }),
        ]),
      ),
      quiz: z.array(
        z.strictObject({
          id: z.string(),
          kind: z.enum(["numeric", "ratio", "choice"]),
          promptHtml: z.string(),
          hintHtml: z.string(),
          weight: z.number(),
          options: z.array(z.strictObject({ id: z.string(), html: z.string() })).optional(),
          multiple: z.boolean().optional(),
          placeholder: z.string().optional(),
        }),
      ),
      task: z.discriminatedUnion("kind", [
        z.strictObject({
          kind: z.literal("roof"),
          title: z.string(),
          goalHtml: z.string(),
          start: roofSpecRef,
          editable: z.array(z.string()),
          criteria: z.array(
            z.strictObject({
              id: z.string(),
              // Kind and limit let the editor measure each criterion live.
              kind: z.string().optional(),
              limit: z.unknown().optional(),
              label: z.string(),
              weight: z.number(),
              required: z.boolean(),
            }),
          ),
          hints: z.array(z.string()),
        }),
        // An as-built task (docs/grading.md): the design, the survey with each point's design level, what to find.
        z.strictObject({
          kind: z.literal("as-built"),
          title: z.string(),
          goalHtml: z.string(),
          design: roofSpecRef,
          survey: z.array(
            z.strictObject({
              label: z.string(),
              at: z.array(z.number()),
              level: z.number(),
              design: z.number(),
            }),
          ),
          tolerance: z.strictObject({ deviation: z.number(), pondDepth: z.number() }),
          findings: z.array(
            z.strictObject({
              id: z.string(),
              kind: z.string(),
              label: z.string(),
              weight: z.number(),
              required: z.boolean(),
              options: z.array(z.strictObject({ id: z.string(), text: z.string() })).optional(),
              placeholder: z.string().optional(),
            }),
          ),
          hints: z.array(z.string()),
        }),
      ]),
    }),
  })
  .meta({ id: "Lesson", description: "A lesson as the player shows it: no answers, no reference roof." });

// ---- Attempts (docs/grading.md) ----

const itemResult = z
  .strictObject({
    id: z.string(),
    section: z.enum(["quiz", "task"]),
    label: z.string(),
    passed: z.boolean(),
    score: z.number(),
    weight: z.number(),
    feedback: z.string(),
    measured: z.string().nullable(),
    required: z.boolean().optional(),
  })
  .meta({ id: "ItemResult" });

const attempt = z
  .strictObject({
    id: z.uuid(),
    traineeId: z.uuid(),
    lesson: z.string(),
    lessonTitle: z.string(),
    lessonVersion: z.string(),
    submittedAt: isoTime,
    score: z.number(),
    passed: z.boolean(),
    timeSpentSeconds: z.number().int(),
    answers: z.record(z.string(), z.union([z.string(), z.array(z.string())])),
    spec: roofSpecRef,
    results: z.strictObject({
      score: z.number(),
      // Points earned before the grading rule caps a score whose required check failed (docs/grading.md).
      rawScore: z.number().optional(),
      passed: z.boolean(),
      passMark: z.number(),
      quiz: z.array(itemResult),
      task: z.array(itemResult),
      roof: z.strictObject({ highLevel: z.number(), longestFallRatio: ratio, outlets: z.number().int() }).nullable(),
    }),
  })
  .meta({ id: "Attempt" });

export const attemptSchema = z.strictObject({ attempt }).meta({ id: "AttemptEnvelope" });
export const attemptListSchema = z.strictObject({ attempts: z.array(attempt) }).meta({ id: "AttemptList" });
