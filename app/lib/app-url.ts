/**
 * APP_URL: the one base of every link the app sends out (password reset, invitation, review
 * notices). Never the request's Host or Origin, which anyone can set (docs/security.md). The
 * server refuses to start without it; `npm start`, `npm run dev` and the test runners set it
 * to the local address they serve on.
 */
export function appUrlProblem(value: string | undefined): string | null {
  if (!value)
    return "APP_URL is not set. Set it to the address users open, e.g. APP_URL=https://fallwright.example.org (links in e-mail are built from it).";
  let url: URL;
  try {
    url = new URL(value);
  } catch {
    return `APP_URL (${JSON.stringify(value)}) is not a URL. Set it to the address users open, e.g. https://fallwright.example.org.`;
  }
  if (url.protocol !== "http:" && url.protocol !== "https:")
    return `APP_URL must start with http:// or https:// (it is ${JSON.stringify(value)}).`;
  if (url.username || url.password || url.search || url.hash)
    return `APP_URL must be a plain address without user, query or fragment (it is ${JSON.stringify(value)}).`;
  return null;
}

/** The base of links in e-mail, without a trailing slash: APP_URL, checked. */
export function appOrigin(): string {
  const value = process.env.APP_URL;
  const problem = appUrlProblem(value);
  if (problem) throw new Error(problem);
  return value!.replace(/\/+$/, "");
}
