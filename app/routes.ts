import { type RouteConfig, index, layout, route } from "@react-router/dev/routes";

export default [
  route("healthz", "routes/healthz.ts"),
  route("api/v1", "routes/api.v1._index.ts"),
  layout("routes/_shell.tsx", [
    index("routes/_index.tsx"),
  ]),
] satisfies RouteConfig;
