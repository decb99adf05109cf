/** One permission vocabulary for loaders, actions and the UI (what a role may do). */
export const ROLES = ["admin", "trainer", "trainee", "designer"] as const;
export type Role = (typeof ROLES)[number];

export const PERMISSIONS = {
  "roofs:own": ["admin", "trainer", "trainee", "designer"],
  "lessons:take": ["admin", "trainer", "trainee", "designer"],
  "classes:manage": ["admin", "trainer"],
  "classes:follow": ["trainee"],
  "classes:hand-up": ["trainee"],
  "gradebook:view": ["admin", "trainer"],
  "attempts:review": ["admin", "trainer"],
  "invite:trainee": ["admin", "trainer"],
  "invite:staff": ["admin"],
  "users:manage": ["admin"],
  "outbox:view": ["admin"],
} as const satisfies Record<string, readonly Role[]>;

export type Permission = keyof typeof PERMISSIONS;

export function can(role: Role | null | undefined, permission: Permission): boolean {
  if (!role) return false;
  return (PERMISSIONS[permission] as readonly Role[]).includes(role);
}

export const ROLE_LABELS: Record<Role, string> = {
  admin: "Admin",
  trainer: "Trainer",
  trainee: "Trainee",
  designer: "Designer",
};
