import { Links, Meta, Outlet, Scripts, ScrollRestoration } from "react-router";
import type { Route } from "./+types/root";
import { GeneralErrorBoundary, useMarkHydrated } from "~/components/error-boundary";
import { pickLocale } from "~/lib/when";
import "./app.css";

export const links: Route.LinksFunction = () => [{ rel: "icon", href: "/favicon.ico" }];

/**
 * The page load's request id, which the error page quotes (it names the load, so it is never
 * revalidated), and the reader's locale for dates, so server and browser write them alike.
 */
export function loader({ request, context }: Route.LoaderArgs) {
  return { requestId: context?.requestId ?? null, locale: pickLocale(request.headers.get("accept-language")) };
}

export function shouldRevalidate() {
  return false;
}

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
  useMarkHydrated();
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
