import { describe, expect, it } from "vitest";
import { can, PERMISSIONS, ROLES } from "~/lib/permissions";

describe("permissions", () => {
  it("lets only admins manage users", () => {
    expect(ROLES.filter((r) => can(r, "users:manage"))).toEqual(["admin"]);
  });
  it("gives nothing to an anonymous visitor", () => {
    for (const p of Object.keys(PERMISSIONS) as (keyof typeof PERMISSIONS)[]) expect(can(null, p)).toBe(false);
  });
  it("offers the Classes page to those who run or sit in classes, not to designers (issue 16: it was empty for them)", () => {
    expect(ROLES.filter((r) => can(r, "classes:view"))).toEqual(["admin", "trainer", "trainee"]);
  });
  it("lets trainers but not trainees see the gradebook", () => {
    expect(can("trainer", "gradebook:view")).toBe(true);
    expect(can("trainee", "gradebook:view")).toBe(false);
  });
});
