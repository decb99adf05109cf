import { redirect } from "react-router";
import type { Route } from "./+types/logout";
import { signOut } from "~/lib/auth.server";

// Signing out changes data, so only a POST does it; a stray GET just goes home.
export async function loader() {
  return redirect("/");
}

export async function action({ request, context }: Route.ActionArgs) {
  const setCookie = await signOut(request, context);
  return redirect("/login?notice=signed-out", { headers: { "Set-Cookie": setCookie } });
}
