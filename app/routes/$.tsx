import { data } from "react-router";
import { GeneralErrorBoundary } from "~/components/error-boundary";

/** Any address no route claims: the 404 page inside the shell, with its navigation. */
export function loader() {
  throw data(null, { status: 404 });
}

export const meta = () => [{ title: "Nothing here · Fallwright" }];

export default function NotFound() {
  return null;
}

export function ErrorBoundary() {
  return <GeneralErrorBoundary />;
}
