import { type RouteConfig, index, layout, route } from "@react-router/dev/routes";

export default [
  route("healthz", "routes/healthz.ts"),
  route("api/v1", "routes/api.v1._index.ts"),
  route("api/v1/roofs", "routes/api.v1.roofs.ts"),
  route("api/v1/roofs/:id", "routes/api.v1.roofs.$id.ts"),
  route("roofs/:id/underlay", "routes/roofs.$id.underlay.ts"),
  route("roofs/new", "routes/roofs.new.ts"),
  route("roofs/:id/export", "routes/roofs.$id.export.ts"),
  route("logout", "routes/logout.ts"),
  route("sandbox/schedule.csv", "routes/sandbox.schedule-csv.ts"),
  layout("routes/_shell.tsx", [
    index("routes/_index.tsx"),
    route("sandbox", "routes/sandbox.tsx"),
    route("sandbox/sheet", "routes/sandbox.sheet.tsx"),
    route("roofs", "routes/roofs._index.tsx"),
    route("roofs/:id", "routes/roofs.$id.tsx"),
    route("login", "routes/login.tsx"),
    route("signup", "routes/signup.tsx"),
    route("forgot-password", "routes/forgot-password.tsx"),
    route("reset-password/:token", "routes/reset-password.$token.tsx"),
    route("invite/:token", "routes/invite.$token.tsx"),
    route("account", "routes/account.tsx"),
    route("admin", "routes/admin.tsx", [
      index("routes/admin._index.tsx"),
      route("audit", "routes/admin.audit.tsx"),
      route("outbox", "routes/admin.outbox.tsx"),
    ]),
  ]),
] satisfies RouteConfig;
