import { isRouteErrorResponse, Link, useRouteError } from "react-router-dom";
import { paths } from "../lib/paths.ts";

export function RouteErrorPage() {
  const err = useRouteError();
  const message = isRouteErrorResponse(err) ? `${err.status} ${err.statusText}` : err instanceof Error ? err.message : "Unknown error";
  return (
    <div className="mx-auto max-w-page px-6 py-16">
      <h1 className="text-2xl mb-3">This page failed to load</h1>
      <p className="text-ink-soft mb-6">{message}</p>
      <Link to={paths.home()}>Back to the overview</Link>
    </div>
  );
}
