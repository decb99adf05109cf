import { useEffect, useState } from "react";
import { Form, Link, NavLink, Outlet, useLocation, useMatches } from "react-router";
import type { Route } from "./+types/_shell";
import { getOptionalUser } from "~/lib/auth.server";
import { can, ROLE_LABELS, type Permission } from "~/lib/permissions";
import { PageErrorBoundary } from "~/components/error-boundary";
import { Caution } from "~/components/caution";
import { UnitsProvider, UnitsSwitch } from "~/components/units";

export async function loader({ request }: Route.LoaderArgs) {
  const user = await getOptionalUser(request);
  return { user };
}

const NAV: { to: string; label: string; permission?: Permission; signedIn?: boolean }[] = [
  { to: "/", label: "Home" },
  { to: "/sandbox", label: "Sandbox" },
  { to: "/roofs", label: "Roofs", permission: "roofs:own" },
  { to: "/lessons", label: "Lessons" },
  { to: "/classes", label: "Classes", permission: "classes:view" },
  { to: "/courses", label: "Courses", permission: "courses:view" },
  { to: "/gradebook", label: "Gradebook", permission: "gradebook:view" },
  { to: "/admin", label: "Admin", permission: "users:manage" },
];

export default function Shell({ loaderData }: Route.ComponentProps) {
  const { user } = loaderData;
  // A page that prints its own caution (the check sheet) keeps to one.
  const ownCaution = useMatches().some((m) => (m.handle as { ownCaution?: boolean } | undefined)?.ownCaution);
  const items = NAV.filter((n) => (n.permission ? can(user?.role, n.permission) : n.signedIn ? !!user : true));
  // The phone menu closes once a link in it has taken the reader to another page.
  const [menuOpen, setMenuOpen] = useState(false);
  const { pathname } = useLocation();
  useEffect(() => setMenuOpen(false), [pathname]);
  return (
    <UnitsProvider saved={user?.units ?? null} signedIn={!!user}>
      <div className="flex min-h-screen flex-col">
        <a
          href="#main"
          className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:bg-sheet focus:p-2"
        >
          Skip to content
        </a>
        <header className="no-print border-b-2 border-ink bg-sheet/90">
          <div className="mx-auto flex max-w-7xl flex-wrap items-center gap-x-6 gap-y-2 px-4 py-3">
            <Link to="/" className="flex items-center gap-2 text-lg font-bold tracking-tight">
              <svg width="28" height="20" viewBox="0 0 28 20" aria-hidden="true">
                <path d="M1 3 L14 17 L27 3" fill="none" stroke="currentColor" strokeWidth="2" />
                <circle cx="14" cy="17" r="2.5" className="fill-accent" />
              </svg>
              Fallwright
            </Link>
            {/* On a phone the links and the account sit behind one button, so the page starts at the top of the screen. */}
            {user ? null : (
              // Signed out on a phone, signing in stays one tap away, beside the menu.
              <Link className="btn-primary ml-auto md:hidden" to="/login">
                Sign in
              </Link>
            )}
            <button
              type="button"
              className={`btn md:hidden ${user ? "ml-auto" : ""}`}
              aria-expanded={menuOpen}
              aria-controls="site-menu"
              onClick={() => setMenuOpen((open) => !open)}
            >
              {menuOpen ? "Close menu" : "Menu"}
            </button>
            <div
              id="site-menu"
              className={`${menuOpen ? "flex" : "hidden"} w-full flex-col gap-3 md:flex md:w-auto md:flex-1 md:flex-row md:flex-wrap md:items-center md:gap-x-6`}
            >
              <nav aria-label="Main" className="flex flex-wrap gap-1 text-sm">
                {items.map((n) => (
                  <NavLink
                    key={n.to}
                    to={n.to}
                    end={n.to === "/"}
                    className={({ isActive }) =>
                      `inline-flex min-h-11 items-center rounded px-3 md:min-h-0 md:px-2 md:py-1 ${isActive ? "bg-ink text-sheet" : "hover:bg-paper-deep"}`
                    }
                  >
                    {n.label}
                  </NavLink>
                ))}
              </nav>
              <div className="flex flex-wrap items-center gap-3 text-sm md:ml-auto">
                <UnitsSwitch />
                {user ? (
                  <>
                    <span>
                      {user.name || user.email} <span className="text-ink-soft">· {ROLE_LABELS[user.role]}</span>
                    </span>
                    <NavLink
                      to="/account"
                      className={({ isActive }) =>
                        `inline-flex min-h-11 items-center rounded px-3 md:min-h-0 md:px-2 md:py-1 ${isActive ? "bg-ink text-sheet" : "hover:bg-paper-deep"}`
                      }
                    >
                      Account
                    </NavLink>
                    <Form method="post" action="/logout">
                      <button className="btn" type="submit">
                        Sign out
                      </button>
                    </Form>
                  </>
                ) : (
                  <Link className="btn-primary max-md:hidden" to="/login">
                    Sign in
                  </Link>
                )}
              </div>
            </div>
          </div>
        </header>
        <main id="main" className="mx-auto w-full max-w-7xl flex-1 px-4 py-6">
          <Outlet />
        </main>
        {ownCaution ? null : (
          <footer className="no-print border-t border-rule bg-sheet/80">
            <div className="mx-auto max-w-7xl px-4 py-3">
              <Caution compact />
            </div>
          </footer>
        )}
      </div>
    </UnitsProvider>
  );
}

export { PageErrorBoundary as ErrorBoundary };
