/** What the audit log records, with the words the admin audit page shows (safe for the browser). */
export const AUDIT_ACTIONS = {
  sign_in: "Signed in",
  sign_in_failed: "Failed sign-in",
  sign_in_limited: "Sign-in refused (too many attempts)",
  sign_out: "Signed out",
  sign_out_everywhere: "Signed out everywhere",
  password_changed: "Changed password",
  password_reset_requested: "Asked for a password reset",
  password_reset: "Reset password",
  profile_changed: "Changed name",
  role_changed: "Role changed",
  user_deactivated: "Deactivated",
  user_reactivated: "Reactivated",
  invitation_sent: "Invitation sent",
  invitation_accepted: "Invitation accepted",
  signed_up: "Signed up",
  signup_setting_changed: "Open designer sign-up changed",
  certificate_revoked: "Certificate revoked",
} as const;

export type AuditAction = keyof typeof AUDIT_ACTIONS;
