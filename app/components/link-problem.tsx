import { Link } from "react-router";
import { AuthCard } from "~/components/form-field";

const WHY = {
  used: "This link was already used. Each link works once.",
  expired: "This link has expired.",
  unknown: "This link is not valid. Check that the whole address was copied from the e-mail.",
} as const;

/** What an e-mailed link shows when it can no longer be used, with the way forward. */
export function LinkProblem({ state, kind }: { state: keyof typeof WHY; kind: "invitation" | "reset" }) {
  return (
    <AuthCard title={kind === "invitation" ? "This invitation cannot be used" : "This reset link cannot be used"}>
      <p>{WHY[state]}</p>
      <p className="mt-3 text-sm text-ink-soft">
        {kind === "invitation"
          ? "Ask whoever invited you to send a new invitation. If you already set up your account, sign in."
          : "Ask for a new link; it is sent to the same address."}
      </p>
      <p className="mt-5 flex flex-wrap gap-3">
        {kind === "reset" ? (
          <Link className="btn-primary" to="/forgot-password">
            Ask for a new link
          </Link>
        ) : null}
        <Link className="btn" to="/login">
          Sign in
        </Link>
      </p>
    </AuthCard>
  );
}

export const LINK_STATUS = { used: 410, expired: 410, unknown: 404 } as const;
