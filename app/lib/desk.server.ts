import type { SessionUser } from "~/lib/auth.server";
import { assignmentsForTrainee, listClassesFor } from "~/lib/classes.server";
import { listMyRoofs } from "~/lib/roofs.server";

export interface Desk {
  name: string;
  role: SessionUser["role"];
  classes: {
    id: string;
    name: string;
    startsOn: string | null;
    endsOn: string | null;
    members: number;
    pending: number;
  }[];
  /** Lessons assigned to me and not passed yet, soonest due first. */
  todo: { slug: string; title: string; dueOn: string | null; className: string; tried: boolean }[];
  roofs: { id: string; name: string; updatedAt: string }[];
}

/** What the home page puts in front of a signed-in person: where they left off. */
export async function deskFor(user: SessionUser): Promise<Desk> {
  const [classes, roofs] = await Promise.all([listClassesFor(user), listMyRoofs(user, 3)]);
  let todo: Desk["todo"] = [];
  if (user.role === "trainee") {
    const byClass = await assignmentsForTrainee(
      user.id,
      classes.map((c) => c.id),
    );
    todo = classes
      .flatMap((c) =>
        (byClass[c.id] ?? [])
          .filter((a) => !a.cell?.passed)
          .map((a) => ({ slug: a.slug, title: a.title, dueOn: a.dueOn, className: c.name, tried: a.cell !== null })),
      )
      .sort((a, b) => (a.dueOn ?? "9999").localeCompare(b.dueOn ?? "9999"))
      .slice(0, 5);
  }
  return {
    name: user.name,
    role: user.role,
    classes: classes.slice(0, 4).map((c) => ({
      id: c.id,
      name: c.name,
      startsOn: c.starts_on,
      endsOn: c.ends_on,
      members: c.members,
      pending: c.pending,
    })),
    todo,
    roofs: roofs.map((r) => ({ id: r.id, name: r.name, updatedAt: r.updatedAt })),
  };
}
