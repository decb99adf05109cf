import { type RouteConfig, index, layout, route } from "@react-router/dev/routes";

export default [
  route("healthz", "routes/healthz.ts"),
  route("api/v1", "routes/api.v1._index.ts"),
  route("api/v1/roofs", "routes/api.v1.roofs.ts"),
  route("api/v1/roofs/:id", "routes/api.v1.roofs.$id.ts"),
  route("roofs/:id/underlay", "routes/roofs.$id.underlay.ts"),
  layout("routes/_shell.tsx", [
    index("routes/_index.tsx"),
  ]),
] satisfies RouteConfig;
