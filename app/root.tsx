import {
  isRouteErrorResponse,
  Links,
  Meta,
  Outlet,
  Scripts,
  ScrollRestoration,
  useRouteError,
  useRouteLoaderData,
} from "react-router";
import type { Route } from "./+types/root";
import { GeneralErrorBoundary } from "~/components/error-boundary";
import { pickLocale } from "~/lib/when";
import "./app.css";

/** The reader's locale for dates, so server and browser write them alike. */
export function loader({ request }: Route.LoaderArgs) {
  return { locale: pickLocale(request.headers.get("accept-language")) };
}

export const links: Route.LinksFunction = () => [{ rel: "icon", href: "/favicon.ico" }];

export function Layout({ children }: { children: React.ReactNode }) {
  return (
    <html lang="en">
      <head>
        <meta charSet="utf-8" />
        <meta name="viewport" content="width=device-width, initial-scale=1" />
        <Meta />
        <Links />
      </head>
      <body className="antialiased">
        {children}
        <ScrollRestoration />
        <Scripts />
      </body>
    </html>
  );
}

export default function App() {
  return <Outlet />;
}

export function ErrorBoundary() {
  return (
    <main className="mx-auto max-w-2xl p-8">
      <p className="mb-6 text-2xl font-bold tracking-tight">Fallwright</p>
      <GeneralErrorBoundary />
    </main>
  );
}
