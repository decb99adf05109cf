/**
 * The database tables as TypeScript sees them (Knex's table type augmentation): what a select
 * returns, and what an insert must give (columns with a default or that may be null are optional).
 * Written by `npm run db:types` (db/table-types.ts) from the migrated schema: do not edit by hand;
 * tests/integration/db-tables.test.ts fails while this file differs from what the script writes.
 * jsonb columns are `unknown` here: what is stored is read through its own schema or type at the
 * edge. Dates (`date`) come back as "YYYY-MM-DD" text (see db.server.ts), bigint as text (pg's default).
 */
import type { Knex } from "knex";
import type { LivePhase } from "~/lib/live.server";
import type { Role } from "~/lib/permissions";

/** What a write may give for a column: its value, or SQL (`now()`), and text for a timestamp. */
type Writable<T> = {
  [K in keyof T]: T[K] extends Date
    ? Date | string | Knex.Raw
    : T[K] extends Date | null
      ? Date | string | Knex.Raw | null
      : T[K] | Knex.Raw;
};

export interface AsBuiltCheckRow {
  id: string;
  roof_id: string;
  roof_version: number;
  spec: unknown;
  measured_by: string;
  checked_by: string;
  measured_on: string;
  points: unknown;
  tolerance: unknown;
  passed: boolean;
  result: unknown;
  source: string;
  created_by: string | null;
  created_at: Date;
}
export type AsBuiltCheckInsert = Omit<AsBuiltCheckRow, "id" | "created_by" | "created_at"> &
  Partial<Pick<AsBuiltCheckRow, "id" | "created_by" | "created_at">>;

export interface AssignmentRow {
  class_id: string;
  lesson_slug: string;
  due_on: string | null;
  created_at: Date;
}
export type AssignmentInsert = Omit<AssignmentRow, "due_on" | "created_at"> &
  Partial<Pick<AssignmentRow, "due_on" | "created_at">>;

export interface AttemptReviewRow {
  id: string;
  attempt_id: string;
  reviewer_id: string;
  comment: string;
  override_score: number | null;
  override_passed: boolean | null;
  reason: string | null;
  at: Date;
}
export type AttemptReviewInsert = Omit<
  AttemptReviewRow,
  "id" | "comment" | "override_score" | "override_passed" | "reason" | "at"
> &
  Partial<Pick<AttemptReviewRow, "id" | "comment" | "override_score" | "override_passed" | "reason" | "at">>;

export interface AttemptRow {
  id: string;
  trainee_id: string;
  lesson_slug: string;
  lesson_version: string;
  idempotency_key: string;
  spec: unknown | null;
  answers: unknown;
  results: unknown;
  score: number;
  passed: boolean;
  time_spent_s: number;
  submitted_at: Date;
  idempotency_hash: string | null;
}
export type AttemptInsert = Omit<
  AttemptRow,
  "id" | "spec" | "answers" | "time_spent_s" | "submitted_at" | "idempotency_hash"
> &
  Partial<Pick<AttemptRow, "id" | "spec" | "answers" | "time_spent_s" | "submitted_at" | "idempotency_hash">>;

export interface AuditLogRow {
  id: string;
  actor_id: string | null;
  subject_id: string | null;
  action: string;
  detail: unknown;
  ip: string | null;
  at: Date;
}
export type AuditLogInsert = Omit<AuditLogRow, "id" | "actor_id" | "subject_id" | "detail" | "ip" | "at"> &
  Partial<Pick<AuditLogRow, "id" | "actor_id" | "subject_id" | "detail" | "ip" | "at">>;

export interface CertificateRow {
  id: string;
  trainee_id: string;
  course_id: string;
  organisation_id: string;
  issued_at: Date;
  code: string;
  revoked_at: Date | null;
  revoked_by: string | null;
  revoke_reason: string | null;
}
export type CertificateInsert = Omit<
  CertificateRow,
  "id" | "issued_at" | "revoked_at" | "revoked_by" | "revoke_reason"
> &
  Partial<Pick<CertificateRow, "id" | "issued_at" | "revoked_at" | "revoked_by" | "revoke_reason">>;

export interface ClassHandUpRow {
  id: string;
  class_id: string;
  user_id: string;
  title: string;
  spec: unknown;
  figures: unknown;
  created_at: Date;
}
export type ClassHandUpInsert = Omit<ClassHandUpRow, "id" | "title" | "created_at"> &
  Partial<Pick<ClassHandUpRow, "id" | "title" | "created_at">>;

export interface ClassMemberRow {
  class_id: string;
  user_id: string;
  joined_at: Date;
}
export type ClassMemberInsert = Omit<ClassMemberRow, "joined_at"> & Partial<Pick<ClassMemberRow, "joined_at">>;

export interface ClassRow {
  id: string;
  organisation_id: string;
  trainer_id: string;
  name: string;
  starts_on: string | null;
  ends_on: string | null;
  venue: string;
  live_state: unknown | null;
  live_seq: number;
  created_at: Date;
  live_phase: LivePhase;
  wall_seq: number;
  course_id: string | null;
}
export type ClassInsert = Omit<
  ClassRow,
  | "id"
  | "starts_on"
  | "ends_on"
  | "venue"
  | "live_state"
  | "live_seq"
  | "created_at"
  | "live_phase"
  | "wall_seq"
  | "course_id"
> &
  Partial<
    Pick<
      ClassRow,
      | "id"
      | "starts_on"
      | "ends_on"
      | "venue"
      | "live_state"
      | "live_seq"
      | "created_at"
      | "live_phase"
      | "wall_seq"
      | "course_id"
    >
  >;

export interface CourseLessonRow {
  course_id: string;
  lesson_slug: string;
  position: number;
}
export type CourseLessonInsert = CourseLessonRow;

export interface CourseRow {
  id: string;
  organisation_id: string;
  name: string;
  description: string;
  created_by: string | null;
  created_at: Date;
  updated_at: Date;
}
export type CourseInsert = Omit<CourseRow, "id" | "description" | "created_by" | "created_at" | "updated_at"> &
  Partial<Pick<CourseRow, "id" | "description" | "created_by" | "created_at" | "updated_at">>;

export interface LessonVersionRow {
  slug: string;
  version: string;
  content: unknown;
  first_seen_at: Date;
  number: number;
  created_by: string | null;
  source: string | null;
}
export type LessonVersionInsert = Omit<LessonVersionRow, "first_seen_at" | "created_by" | "source"> &
  Partial<Pick<LessonVersionRow, "first_seen_at" | "created_by" | "source">>;

export interface LessonRow {
  slug: string;
  title: string;
  position: number;
  version: string;
  content: unknown;
  synced_at: Date;
  organisation_id: string | null;
  status: string;
  author_id: string | null;
  source: string | null;
  created_at: Date;
  updated_at: Date;
}
export type LessonInsert = Omit<
  LessonRow,
  "synced_at" | "organisation_id" | "status" | "author_id" | "source" | "created_at" | "updated_at"
> &
  Partial<
    Pick<LessonRow, "synced_at" | "organisation_id" | "status" | "author_id" | "source" | "created_at" | "updated_at">
  >;

export interface OrganisationRow {
  id: string;
  name: string;
  open_designer_signup: boolean;
  created_at: Date;
}
export type OrganisationInsert = Omit<OrganisationRow, "id" | "open_designer_signup" | "created_at"> &
  Partial<Pick<OrganisationRow, "id" | "open_designer_signup" | "created_at">>;

export interface RateLimitRow {
  key: string;
  window_start: Date;
  count: number;
}
export type RateLimitInsert = Omit<RateLimitRow, "count"> & Partial<Pick<RateLimitRow, "count">>;

export interface RoofVersionRow {
  roof_id: string;
  version: number;
  name: string;
  spec: unknown;
  saved_by: string | null;
  saved_at: Date;
  kind: string;
}
export type RoofVersionInsert = Omit<RoofVersionRow, "saved_by" | "saved_at" | "kind"> &
  Partial<Pick<RoofVersionRow, "saved_by" | "saved_at" | "kind">>;

export interface RoofRow {
  id: string;
  owner_id: string;
  name: string;
  spec: unknown;
  version: number;
  shared: boolean;
  underlay_id: string | null;
  underlay: unknown;
  created_at: Date;
  updated_at: Date;
  deleted_at: Date | null;
  idempotency_key: string | null;
  idempotency_hash: string | null;
}
export type RoofInsert = Omit<
  RoofRow,
  | "id"
  | "version"
  | "shared"
  | "underlay_id"
  | "underlay"
  | "created_at"
  | "updated_at"
  | "deleted_at"
  | "idempotency_key"
  | "idempotency_hash"
> &
  Partial<
    Pick<
      RoofRow,
      | "id"
      | "version"
      | "shared"
      | "underlay_id"
      | "underlay"
      | "created_at"
      | "updated_at"
      | "deleted_at"
      | "idempotency_key"
      | "idempotency_hash"
    >
  >;

export interface SessionRow {
  id: string;
  user_id: string;
  created_at: Date;
  last_seen_at: Date;
  expires_at: Date;
  user_agent: string | null;
}
export type SessionInsert = Omit<SessionRow, "created_at" | "last_seen_at" | "user_agent"> &
  Partial<Pick<SessionRow, "created_at" | "last_seen_at" | "user_agent">>;

export interface ShareLinkRow {
  id: string;
  roof_id: string;
  token_hash: string;
  created_by: string | null;
  created_at: Date;
  revoked_at: Date | null;
}
export type ShareLinkInsert = Omit<ShareLinkRow, "id" | "created_by" | "created_at" | "revoked_at"> &
  Partial<Pick<ShareLinkRow, "id" | "created_by" | "created_at" | "revoked_at">>;

export interface TokenRow {
  hash: string;
  kind: string;
  user_id: string | null;
  email: string;
  role: Role | null;
  class_id: string | null;
  created_by: string | null;
  created_at: Date;
  expires_at: Date;
  used_at: Date | null;
}
export type TokenInsert = Omit<TokenRow, "user_id" | "role" | "class_id" | "created_by" | "created_at" | "used_at"> &
  Partial<Pick<TokenRow, "user_id" | "role" | "class_id" | "created_by" | "created_at" | "used_at">>;

export interface UploadRow {
  id: string;
  owner_id: string;
  storage_key: string;
  content_type: string;
  size: number;
  original_name: string;
  created_at: Date;
}
export type UploadInsert = Omit<UploadRow, "id" | "original_name" | "created_at"> &
  Partial<Pick<UploadRow, "id" | "original_name" | "created_at">>;

export interface UserRow {
  id: string;
  organisation_id: string;
  email: string;
  name: string;
  role: Role;
  password_hash: string | null;
  active: boolean;
  created_at: Date;
  password_changed_at: Date | null;
  units: string | null;
}
export type UserInsert = Omit<
  UserRow,
  "id" | "name" | "password_hash" | "active" | "created_at" | "password_changed_at" | "units"
> &
  Partial<Pick<UserRow, "id" | "name" | "password_hash" | "active" | "created_at" | "password_changed_at" | "units">>;

/** Every table and its columns, for the test that holds these types to the live schema. */
export const TABLE_COLUMNS = {
  as_built_checks: [
    "id",
    "roof_id",
    "roof_version",
    "spec",
    "measured_by",
    "checked_by",
    "measured_on",
    "points",
    "tolerance",
    "passed",
    "result",
    "source",
    "created_by",
    "created_at",
  ],
  assignments: ["class_id", "lesson_slug", "due_on", "created_at"],
  attempt_reviews: ["id", "attempt_id", "reviewer_id", "comment", "override_score", "override_passed", "reason", "at"],
  attempts: [
    "id",
    "trainee_id",
    "lesson_slug",
    "lesson_version",
    "idempotency_key",
    "spec",
    "answers",
    "results",
    "score",
    "passed",
    "time_spent_s",
    "submitted_at",
    "idempotency_hash",
  ],
  audit_log: ["id", "actor_id", "subject_id", "action", "detail", "ip", "at"],
  certificates: [
    "id",
    "trainee_id",
    "course_id",
    "organisation_id",
    "issued_at",
    "code",
    "revoked_at",
    "revoked_by",
    "revoke_reason",
  ],
  class_hand_ups: ["id", "class_id", "user_id", "title", "spec", "figures", "created_at"],
  class_members: ["class_id", "user_id", "joined_at"],
  classes: [
    "id",
    "organisation_id",
    "trainer_id",
    "name",
    "starts_on",
    "ends_on",
    "venue",
    "live_state",
    "live_seq",
    "created_at",
    "live_phase",
    "wall_seq",
    "course_id",
  ],
  course_lessons: ["course_id", "lesson_slug", "position"],
  courses: ["id", "organisation_id", "name", "description", "created_by", "created_at", "updated_at"],
  lesson_versions: ["slug", "version", "content", "first_seen_at", "number", "created_by", "source"],
  lessons: [
    "slug",
    "title",
    "position",
    "version",
    "content",
    "synced_at",
    "organisation_id",
    "status",
    "author_id",
    "source",
    "created_at",
    "updated_at",
  ],
  organisations: ["id", "name", "open_designer_signup", "created_at"],
  rate_limits: ["key", "window_start", "count"],
  roof_versions: ["roof_id", "version", "name", "spec", "saved_by", "saved_at", "kind"],
  roofs: [
    "id",
    "owner_id",
    "name",
    "spec",
    "version",
    "shared",
    "underlay_id",
    "underlay",
    "created_at",
    "updated_at",
    "deleted_at",
    "idempotency_key",
    "idempotency_hash",
  ],
  sessions: ["id", "user_id", "created_at", "last_seen_at", "expires_at", "user_agent"],
  share_links: ["id", "roof_id", "token_hash", "created_by", "created_at", "revoked_at"],
  tokens: ["hash", "kind", "user_id", "email", "role", "class_id", "created_by", "created_at", "expires_at", "used_at"],
  uploads: ["id", "owner_id", "storage_key", "content_type", "size", "original_name", "created_at"],
  users: [
    "id",
    "organisation_id",
    "email",
    "name",
    "role",
    "password_hash",
    "active",
    "created_at",
    "password_changed_at",
    "units",
  ],
} as const;

declare module "knex/types/tables" {
  interface Tables {
    as_built_checks: Knex.CompositeTableType<
      AsBuiltCheckRow,
      Writable<AsBuiltCheckInsert>,
      Partial<Writable<AsBuiltCheckRow>>
    >;
    assignments: Knex.CompositeTableType<AssignmentRow, Writable<AssignmentInsert>, Partial<Writable<AssignmentRow>>>;
    attempt_reviews: Knex.CompositeTableType<
      AttemptReviewRow,
      Writable<AttemptReviewInsert>,
      Partial<Writable<AttemptReviewRow>>
    >;
    attempts: Knex.CompositeTableType<AttemptRow, Writable<AttemptInsert>, Partial<Writable<AttemptRow>>>;
    audit_log: Knex.CompositeTableType<AuditLogRow, Writable<AuditLogInsert>, Partial<Writable<AuditLogRow>>>;
    certificates: Knex.CompositeTableType<
      CertificateRow,
      Writable<CertificateInsert>,
      Partial<Writable<CertificateRow>>
    >;
    class_hand_ups: Knex.CompositeTableType<
      ClassHandUpRow,
      Writable<ClassHandUpInsert>,
      Partial<Writable<ClassHandUpRow>>
    >;
    class_members: Knex.CompositeTableType<
      ClassMemberRow,
      Writable<ClassMemberInsert>,
      Partial<Writable<ClassMemberRow>>
    >;
    classes: Knex.CompositeTableType<ClassRow, Writable<ClassInsert>, Partial<Writable<ClassRow>>>;
    course_lessons: Knex.CompositeTableType<
      CourseLessonRow,
      Writable<CourseLessonInsert>,
      Partial<Writable<CourseLessonRow>>
    >;
    courses: Knex.CompositeTableType<CourseRow, Writable<CourseInsert>, Partial<Writable<CourseRow>>>;
    lesson_versions: Knex.CompositeTableType<
      LessonVersionRow,
      Writable<LessonVersionInsert>,
      Partial<Writable<LessonVersionRow>>
    >;
    lessons: Knex.CompositeTableType<LessonRow, Writable<LessonInsert>, Partial<Writable<LessonRow>>>;
    organisations: Knex.CompositeTableType<
      OrganisationRow,
      Writable<OrganisationInsert>,
      Partial<Writable<OrganisationRow>>
    >;
    rate_limits: Knex.CompositeTableType<RateLimitRow, Writable<RateLimitInsert>, Partial<Writable<RateLimitRow>>>;
    roof_versions: Knex.CompositeTableType<
      RoofVersionRow,
      Writable<RoofVersionInsert>,
      Partial<Writable<RoofVersionRow>>
    >;
    roofs: Knex.CompositeTableType<RoofRow, Writable<RoofInsert>, Partial<Writable<RoofRow>>>;
    sessions: Knex.CompositeTableType<SessionRow, Writable<SessionInsert>, Partial<Writable<SessionRow>>>;
    share_links: Knex.CompositeTableType<ShareLinkRow, Writable<ShareLinkInsert>, Partial<Writable<ShareLinkRow>>>;
    tokens: Knex.CompositeTableType<TokenRow, Writable<TokenInsert>, Partial<Writable<TokenRow>>>;
    uploads: Knex.CompositeTableType<UploadRow, Writable<UploadInsert>, Partial<Writable<UploadRow>>>;
    users: Knex.CompositeTableType<UserRow, Writable<UserInsert>, Partial<Writable<UserRow>>>;
  }
}
