/**
 * The roof page's form intents (/roofs/:id): what each fetcher posts, checked by the route's
 * action, and what the action answers, read by the page's components.
 */
import { z } from "zod";
import type { RoofSpec } from "~/engine";
import { pgInt } from "~/lib/input";
import { roofNameSchema } from "~/lib/roof-file";

export const roofIntentSchema = z.discriminatedUnion("intent", [
  z.object({ intent: z.literal("share"), shared: z.enum(["true", "false"]) }),
  z.object({ intent: z.literal("underlay"), settings: z.string().max(2000) }),
  z.object({
    intent: z.literal("restore-version"),
    version: pgInt({ coerce: true }),
    expected: pgInt({ coerce: true }),
  }),
  z.object({ intent: z.literal("duplicate"), name: roofNameSchema.optional() }),
  z.object({ intent: z.literal("share-link-create") }),
  z.object({ intent: z.literal("share-link-revoke"), linkId: z.string().max(100) }),
]);

/** A version of the roof as the page holds it (the autosave's snapshot, a conflict's winner, a restore). */
export interface RoofSnapshot {
  version: number;
  spec: RoofSpec;
  name: string;
}

/** What the roof page's action answers (one field per intent, `error` when refused). */
export type RoofPageActionData = {
  shared?: boolean;
  restored?: RoofSnapshot & { from: number };
  conflict?: RoofSnapshot;
  error?: string;
  shareLink?: { id: string; path: string };
  revoked?: string;
};
