/**
 * The Fallwright roof file: our own small, versioned JSON format for moving a roof between
 * libraries (documented in DEVELOPERS.md, "Roof files"). Reading is strict about the envelope
 * and hands the spec to the engine's parseSpec for the roof itself.
 */
import { z } from "zod";

export const ROOF_FILE_FORMAT = "fallwright-roof";
export const ROOF_FILE_VERSION = 1;
/** Roof files and JSON bodies are small; anything larger is a mistake or an attack. */
export const ROOF_FILE_MAX_BYTES = 256 * 1024;

/** Where an underlay image sits under the plan: plan metres of its top-left corner, and its scale. */
export const underlaySettingsSchema = z.object({
  opacity: z.number().min(0).max(1),
  originX: z.number().min(-1e7).max(1e7),
  originY: z.number().min(-1e7).max(1e7),
  metresPerPixel: z.number().gt(0).max(1000),
  widthPx: z.number().int().min(1).max(100_000),
  heightPx: z.number().int().min(1).max(100_000),
});
export type UnderlaySettings = z.infer<typeof underlaySettingsSchema>;

/** Longest roof name, in characters (the library, the file, the sheet and the share page). */
export const ROOF_NAME_MAX = 120;

/** The one rule for a roof's name: trimmed, not empty, at most ROOF_NAME_MAX characters. */
export const roofNameSchema = z
  .string({ error: "must be text" })
  .trim()
  .min(1, "must not be empty")
  .max(ROOF_NAME_MAX, `must be at most ${ROOF_NAME_MAX} characters`);

export const roofFileSchema = z.object({
  format: z.literal(ROOF_FILE_FORMAT),
  version: z.literal(ROOF_FILE_VERSION),
  name: roofNameSchema,
  exportedAt: z.string().max(40).optional(),
  spec: z.unknown(),
  /** Placement and scale only; the image itself stays in the library it came from. */
  underlay: underlaySettingsSchema.optional(),
});
export type RoofFile = z.infer<typeof roofFileSchema>;

export type RoofFileResult = { ok: true; file: RoofFile } | { ok: false; message: string };

/** Reads the envelope of a roof file (text). The spec inside is checked separately by parseSpec. */
export function readRoofFile(text: string): RoofFileResult {
  if (text.length > ROOF_FILE_MAX_BYTES)
    return { ok: false, message: `The file is over ${ROOF_FILE_MAX_BYTES / 1024} kB; a roof file is much smaller.` };
  let raw: unknown;
  try {
    raw = JSON.parse(text);
  } catch {
    return { ok: false, message: "The file is not JSON. Choose a roof file exported from Fallwright (.json)." };
  }
  if (
    !raw ||
    typeof raw !== "object" ||
    Array.isArray(raw) ||
    (raw as { format?: unknown }).format !== ROOF_FILE_FORMAT
  ) {
    return { ok: false, message: `This is not a Fallwright roof file: it needs "format": "${ROOF_FILE_FORMAT}".` };
  }
  const version = (raw as { version?: unknown }).version;
  if (version !== ROOF_FILE_VERSION) {
    return {
      ok: false,
      message:
        typeof version === "number"
          ? `This roof file is format version ${version}; this Fallwright reads version ${ROOF_FILE_VERSION} only.`
          : `The roof file has no format version; expected "version": ${ROOF_FILE_VERSION}.`,
    };
  }
  const parsed = roofFileSchema.safeParse(raw);
  if (!parsed.success) {
    const first = parsed.error.issues[0];
    return {
      ok: false,
      message: `The roof file is damaged: ${first.path.map(String).join(".") || "(file)"} ${first.message}.`,
    };
  }
  return { ok: true, file: parsed.data };
}

export function writeRoofFile(
  roof: { name: string; spec: unknown; underlay?: UnderlaySettings | null },
  now = new Date(),
): RoofFile {
  const file: RoofFile = {
    format: ROOF_FILE_FORMAT,
    version: ROOF_FILE_VERSION,
    name: roof.name,
    exportedAt: now.toISOString(),
    spec: roof.spec,
  };
  if (roof.underlay) file.underlay = roof.underlay;
  return file;
}

/** A safe file name for a download: letters, digits and dashes only. */
export function roofFileName(name: string): string {
  const stem = name
    .normalize("NFKD")
    .replace(/[^A-Za-z0-9]+/g, "-")
    .replace(/^-+|-+$/g, "")
    .toLowerCase()
    .slice(0, 60);
  return `${stem || "roof"}.fallwright.json`;
}
