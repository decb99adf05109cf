import { NavLink, Outlet } from "react-router";
import type { Route } from "./+types/admin";
import { requirePermission } from "~/lib/auth.server";
import { GeneralErrorBoundary } from "~/components/error-boundary";

export async function loader({ request }: Route.LoaderArgs) {
  await requirePermission(request, "users:manage");
  return null;
}

const TABS = [
  { to: "/admin", label: "Users", end: true },
  { to: "/admin/audit", label: "Audit log", end: false },
  { to: "/admin/outbox", label: "Outbox", end: false },
];

export default function AdminLayout() {
  return (
    <div className="grid gap-5">
      <header className="flex flex-wrap items-end justify-between gap-3 border-b border-rule pb-2">
        <h1 className="text-3xl font-bold tracking-tight">Admin</h1>
        <nav aria-label="Admin" className="flex gap-1 text-sm">
          {TABS.map((t) => (
            <NavLink
              key={t.to}
              to={t.to}
              end={t.end}
              className={({ isActive }) =>
                `rounded-t border border-b-0 px-3 py-1.5 ${isActive ? "border-ink bg-sheet font-medium" : "border-transparent hover:bg-paper-deep"}`
              }
            >
              {t.label}
            </NavLink>
          ))}
        </nav>
      </header>
      <Outlet />
    </div>
  );
}

export function ErrorBoundary() {
  return <GeneralErrorBoundary />;
}
