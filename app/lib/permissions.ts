/** One permission vocabulary for loaders, actions and the UI (what a role may do). */
export const ROLES = ["admin", "trainer", "trainee", "designer"] as const;
export type Role = (typeof ROLES)[number];

export const PERMISSIONS = {
  "roofs:own": ["admin", "trainer", "trainee", "designer"],
  "lessons:take": ["admin", "trainer", "trainee", "designer"],
  // Write, edit, publish, import and export the organisation's own lessons (drafts included).
  "lessons:author": ["admin", "trainer"],
  "classes:manage": ["admin", "trainer"],
  // Who has a Classes page with something on it (designers belong to no class: no menu item).
  "classes:view": ["admin", "trainer", "trainee"],
  "classes:follow": ["trainee"],
  "classes:hand-up": ["trainee"],
  "gradebook:view": ["admin", "trainer"],
  "attempts:review": ["admin", "trainer"],
  "invite:trainee": ["admin", "trainer"],
  "invite:staff": ["admin"],
  "users:manage": ["admin"],
  "outbox:view": ["admin"],
  // Courses and certificates (docs/product.md capability 10): trainees see the courses their classes follow.
  "courses:manage": ["admin", "trainer"],
  "courses:view": ["admin", "trainer", "trainee"],
  "certificates:revoke": ["admin", "trainer"],
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

/**
 * A roof's as-built checks follow the roof (docs/security.md): whoever may read the roof (its
 * owner, or a colleague when it is shared) reads its checks; whoever may edit it adds them.
 * `roof` is the roof as getRoofFor answered for this user (null when they may not see it).
 */
export function checkAccess(roof: { canEdit: boolean } | null): { read: boolean; create: boolean } {
  return { read: roof !== null, create: roof?.canEdit === true };
}
