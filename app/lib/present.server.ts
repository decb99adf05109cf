/** The roofs a trainer can step through in classroom mode: each lesson's figures and task roofs, and their own saved roofs. */
import { classAssignments } from "~/lib/classes.server";
import { db } from "~/lib/db.server";
import { classUsableLessons } from "~/lib/lessons/access.server";
import type { DeckGroup } from "~/lib/present-groups";

/** A roof spec as JSON (checked by the engine when it is published). */
export type SpecJson = Record<string, unknown>;

export interface DeckRoof {
  caption: string;
  spec: SpecJson;
}

export interface Deck {
  key: string;
  title: string;
  group: DeckGroup;
  roofs: DeckRoof[];
}

interface LessonContent {
  title?: string;
  blocks?: { type: string; figure?: { caption?: string; spec?: SpecJson } }[];
  task?: { title?: string; start?: SpecJson; reference?: SpecJson };
}

/** A lesson's roofs in reading order: the figures of its text, then its task's starting roof and a roof that passes. */
export function lessonRoofs(content: LessonContent): DeckRoof[] {
  const roofs: DeckRoof[] = [];
  for (const b of content.blocks ?? []) {
    if (b.type === "roof" && b.figure?.spec) roofs.push({ caption: b.figure.caption ?? "Figure", spec: b.figure.spec });
  }
  if (content.task?.start)
    roofs.push({ caption: `Task “${content.task.title ?? "task"}”: the starting roof`, spec: content.task.start });
  if (content.task?.reference)
    roofs.push({ caption: `Task “${content.task.title ?? "task"}”: a roof that passes`, spec: content.task.reference });
  return roofs;
}

/** Assigned lessons first, then the rest of the course (each part in course order), then my saved roofs. */
export async function presenterDecks(trainerId: string, classId: string, organisationId: string): Promise<Deck[]> {
  const [assigned, lessons, roofs] = await Promise.all([
    classAssignments(classId),
    classUsableLessons(db()("lessons"), organisationId)
      .select("slug", "title", "position", "content")
      .orderBy([{ column: "position" }, { column: "slug" }]),
    db()("roofs")
      .where({ owner_id: trainerId })
      .whereNull("deleted_at")
      .orderBy("updated_at", "desc")
      .limit(50)
      .select("name", "spec"),
  ]);
  const isAssigned = new Set(assigned.map((a) => a.lesson_slug));
  const decks: Deck[] = [];
  for (const l of [
    ...lessons.filter((x) => isAssigned.has(x.slug)),
    ...lessons.filter((x) => !isAssigned.has(x.slug)),
  ]) {
    const deckRoofs = lessonRoofs(l.content as LessonContent);
    if (deckRoofs.length)
      decks.push({
        key: `lesson:${l.slug}`,
        title: `${l.position}. ${l.title}`,
        group: isAssigned.has(l.slug) ? "assigned" : "course",
        roofs: deckRoofs,
      });
  }
  if (roofs.length)
    decks.push({
      key: "roofs",
      title: "My saved roofs",
      group: "roofs",
      roofs: roofs.map((r) => ({ caption: r.name, spec: r.spec as SpecJson })),
    });
  return decks;
}
