import type { ServerBuild } from "react-router";

/**
 * The route pattern a path belongs to ("/roofs/:id"), for log lines and metric labels: a label
 * per route, not per URL, and no token from a path like /reset-password/<token> ever logged.
 */
export function routeLabeller(build: ServerBuild | null): (path: string) => string {
  if (!build) return () => "(dev)";
  const routes = build.routes as Record<string, { id: string; parentId?: string; path?: string }>;
  const full = (id: string | undefined): string => {
    const r = id ? routes[id] : undefined;
    if (!r) return "";
    const parent = full(r.parentId);
    return r.path ? `${parent.replace(/\/$/, "")}/${r.path.replace(/^\//, "")}` : parent;
  };
  const patterns = [...new Set(Object.keys(routes).map((id) => full(id) || "/"))].map((pattern) => {
    const segments = pattern.split("/").filter(Boolean);
    const source = segments
      .map((s) => (s === "*" ? ".*" : s.startsWith(":") ? "[^/]+" : s.replace(/[.*+?^${}()|[\]\\]/g, "\\$&")))
      .join("/");
    return {
      pattern,
      re: new RegExp(`^/${source}/?$`),
      statics: segments.filter((s) => !s.startsWith(":") && s !== "*").length,
    };
  });
  patterns.sort((a, b) => b.statics - a.statics);
  return (rawPath: string) => {
    if (rawPath.startsWith("/assets/")) return "/assets/*";
    // Client navigations fetch "<path>.data" (and "/_root.data" for the home page).
    const path = rawPath === "/_root.data" ? "/" : rawPath.replace(/\.data$/, "");
    for (const p of patterns) if (p.re.test(path)) return p.pattern;
    return "(other)";
  };
}
