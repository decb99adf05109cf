import { When, Day, DateRange } from "~/components/dates";
import type { ReactNode } from "react";
import { Link } from "react-router";
import type { Route } from "./+types/_index";
import { getOptionalUser } from "~/lib/auth.server";
import { deskFor, type Desk } from "~/lib/desk.server";

export const meta: Route.MetaFunction = () => [
  { title: "Fallwright · shape parapet roofs to their outlets" },
  { name: "description", content: "Teach and check how a flat membrane roof inside parapets sheds its water." },
];

export async function loader({ request }: Route.LoaderArgs) {
  const user = await getOptionalUser(request);
  return { desk: user ? await deskFor(user) : null };
}

const WHO = [
  ["Trainers", "present live roofs to a class, hand out lessons, keep a gradebook."],
  ["Trainees", "move outlets, change falls, watch the water, submit graded tasks."],
  ["Designers", "check build-up height, falls and outlet places before detailing."],
  ["Admins", "run accounts, roles and invitations."],
];

function DeskItem({ to, label, children }: { to: string; label: string; children: ReactNode }) {
  return (
    <li className="flex flex-wrap items-baseline justify-between gap-2 py-1.5">
      <Link className="underline" to={to}>
        {label}
      </Link>
      <span className="text-sm text-ink-soft">{children}</span>
    </li>
  );
}

/** Where a signed-in person left off: their classes, the lessons still to pass, recent roofs. */
function YourDesk({ desk }: { desk: Desk }) {
  const teaches = desk.role === "trainer" || desk.role === "admin";
  return (
    <section className="card mt-8" aria-labelledby="desk-title" data-testid="desk">
      <h2 id="desk-title" className="text-lg font-bold">
        Welcome back, {desk.name}
      </h2>
      {desk.role === "trainee" ? (
        <div className="mt-3">
          <h3 className="label">Still to pass</h3>
          {desk.todo.length ? (
            <ul className="mt-1 divide-y divide-rule">
              {desk.todo.map((t) => (
                <DeskItem key={`${t.className}-${t.slug}`} to={`/lessons/${t.slug}`} label={t.title}>
                  {t.className} ·{" "}
                  {t.dueOn ? (
                    <>
                      due <Day iso={t.dueOn} />
                    </>
                  ) : (
                    "no due date"
                  )}
                  {t.tried ? " · tried, not passed yet" : ""}
                </DeskItem>
              ))}
            </ul>
          ) : (
            <p className="mt-1 text-sm text-ink-soft">
              Nothing assigned is waiting: every lesson your classes set is passed, or none is set yet.
            </p>
          )}
        </div>
      ) : null}
      {teaches || desk.classes.length ? (
        <div className="mt-4">
          <h3 className="label">{desk.role === "admin" ? "Classes" : "Your classes"}</h3>
          {desk.classes.length ? (
            <ul className="mt-1 divide-y divide-rule">
              {desk.classes.map((c) => (
                <DeskItem key={c.id} to={`/classes/${c.id}`} label={c.name}>
                  <DateRange from={c.startsOn} to={c.endsOn} />
                  {teaches ? ` · ${c.members} trainees${c.pending ? `, ${c.pending} invited` : ""}` : ""}
                </DeskItem>
              ))}
            </ul>
          ) : (
            <p className="mt-1 text-sm text-ink-soft">
              No classes yet.{" "}
              <Link className="underline" to="/classes">
                Create one
              </Link>{" "}
              and invite trainees by e-mail.
            </p>
          )}
        </div>
      ) : null}
      <div className="mt-4">
        <h3 className="label">Recent roofs</h3>
        {desk.roofs.length ? (
          <ul className="mt-1 divide-y divide-rule">
            {desk.roofs.map((r) => (
              <DeskItem key={r.id} to={`/roofs/${r.id}`} label={r.name}>
                changed <When iso={r.updatedAt} />
              </DeskItem>
            ))}
          </ul>
        ) : (
          <p className="mt-1 text-sm text-ink-soft">
            None saved yet. Shape one in the{" "}
            <Link className="underline" to="/sandbox">
              sandbox
            </Link>{" "}
            and save it to your library.
          </p>
        )}
      </div>
    </section>
  );
}

/** A plan of a shaped roof: level rim, fall lines converging on one outlet. Drawn, not loaded. */
function ShapedRoofSketch() {
  const lines = Array.from({ length: 9 }, (_, i) => 20 + i * 40);
  return (
    <svg
      viewBox="0 0 360 220"
      className="h-auto w-full"
      role="img"
      aria-label="Plan of a roof inside parapets with fall lines running to one outlet on the front edge"
    >
      <rect
        x="10"
        y="10"
        width="340"
        height="200"
        fill="var(--color-sheet)"
        stroke="var(--color-ink)"
        strokeWidth="3"
      />
      {lines.map((x) => (
        <line key={x} x1={x} y1="14" x2={x} y2="206" stroke="var(--color-rule)" strokeWidth="1" strokeDasharray="3 4" />
      ))}
      <clipPath id="home-sketch-inside">
        <rect x="11.5" y="11.5" width="337" height="197" />
      </clipPath>
      {/* The contours stop at the parapet: outside it there is no roof (and the rim is level). */}
      <g clipPath="url(#home-sketch-inside)" data-testid="home-contours">
        {[40, 80, 120, 160].map((d, i) => (
          <path
            key={d}
            d={`M ${180 - d * 1.6} 206 Q 180 ${206 - d * 0.9} ${180 + d * 1.6} 206`}
            fill="none"
            stroke="var(--color-ink-soft)"
            strokeWidth="1"
            opacity={1 - i * 0.15}
          />
        ))}
      </g>
      {[30, 100, 260, 330].map((x) => (
        <path
          key={x}
          d={`M ${x} 30 Q ${(x + 180) / 2} 120 178 200`}
          fill="none"
          stroke="var(--color-accent)"
          strokeWidth="1.6"
          markerEnd="url(#arrow)"
        />
      ))}
      <defs>
        <marker
          id="arrow"
          viewBox="0 0 10 10"
          refX="8"
          refY="5"
          markerWidth="6"
          markerHeight="6"
          orient="auto-start-reverse"
        >
          <path d="M 0 0 L 10 5 L 0 10 z" fill="var(--color-accent)" />
        </marker>
      </defs>
      <circle cx="180" cy="206" r="7" fill="var(--color-accent)" stroke="var(--color-ink)" strokeWidth="2" />
      <text x="194" y="200" fontSize="11" fill="var(--color-ink)">
        outlet
      </text>
      <text x="16" y="26" fontSize="11" fill="var(--color-ink-soft)">
        level rim at H
      </text>
    </svg>
  );
}

export default function Home({ loaderData }: Route.ComponentProps) {
  const { desk } = loaderData;
  return (
    <div className="grid gap-8 lg:grid-cols-[1.2fr_1fr]">
      <section>
        <p className="text-sm font-medium uppercase tracking-widest text-accent">Fallwright</p>
        <h1 className="mt-2 text-display font-bold tracking-tight">Shape the roof, not a gutter.</h1>
        <p className="mt-4 max-w-prose text-lg text-ink-soft">
          Keep the parapet rim level, drop each joist a little more toward the outlet, and a flat membrane roof becomes
          a gently warped surface that sheds its water. Fallwright builds that surface joist by joist, colours it by
          fall, traces the water, sets it beside an internal gutter layout, and gives the builder a drop schedule.
        </p>
        <div className="mt-6 flex flex-wrap gap-3">
          <Link className="btn-primary" to="/sandbox">
            Open the sandbox
          </Link>
          <Link className="btn" to="/lessons">
            Browse the lessons
          </Link>
        </div>
        {desk ? (
          <YourDesk desk={desk} />
        ) : (
          <ul className="mt-8 grid gap-3 sm:grid-cols-2">
            {WHO.map(([who, what]) => (
              <li key={who} className="card">
                <p className="font-bold">{who}</p>
                <p className="text-sm text-ink-soft">{what}</p>
              </li>
            ))}
          </ul>
        )}
      </section>
      <section className="card self-start">
        <ShapedRoofSketch />
        <p className="mt-3 text-sm text-ink-soft">
          A level rim, one outlet, straight joists: the warp does the work a gutter would, without the extra height or
          the folds in the membrane.
        </p>
      </section>
    </div>
  );
}
