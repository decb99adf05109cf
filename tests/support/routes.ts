/** Every route path declared in app/routes.ts, flattened, for tests that must cover them all. */
import type { RouteConfigEntry } from "@react-router/dev/routes";
import routes from "../../app/routes";

export interface RoutePath {
  path: string; // e.g. "/roofs/:id"
  file: string;
  hasChildren: boolean;
}

export function allRoutePaths(): RoutePath[] {
  const out: RoutePath[] = [];
  const walk = (entries: RouteConfigEntry[], prefix: string) => {
    for (const e of entries) {
      const joined = e.index
        ? prefix || "/"
        : e.path !== undefined
          ? `${prefix}/${e.path}`.replace(/\/+/g, "/")
          : prefix;
      if (e.index || e.path !== undefined) {
        out.push({ path: joined || "/", file: e.file, hasChildren: !!e.children?.length });
      }
      if (e.children) walk(e.children, joined);
    }
  };
  walk(routes as RouteConfigEntry[], "");
  return out;
}
