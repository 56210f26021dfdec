import type { ReactNode } from "react";
import { ApiError } from "../../lib/api-client.ts";

export function Loading({ what }: { what: string }) {
  return (
    <p className="text-ink-faint" role="status" aria-live="polite">
      Loading {what}…
    </p>
  );
}

/** A failed request, in words: the server's message when it sent one. */
export function ErrorNote({ error, retry, title = "This could not be loaded." }: { error: unknown; retry?: () => void; title?: string }) {
  const message = error instanceof ApiError ? error.message : error instanceof Error ? error.message : String(error);
  const status = error instanceof ApiError ? ` (${error.status})` : "";
  return (
    <div role="alert" className="rounded border border-brick/40 bg-brick-wash p-3 text-sm">
      <p className="font-semibold text-brick">{title}</p>
      <p className="text-ink-soft mt-1">
        {message}
        {status}
      </p>
      {retry && (
        <button type="button" className="mt-2 underline text-sea" onClick={retry}>
          Try again
        </button>
      )}
    </div>
  );
}

export function Empty({ children }: { children: ReactNode }) {
  return <p className="rounded border border-dashed border-paper-edge p-4 text-ink-soft">{children}</p>;
}

export function Caution({ children, title }: { children: ReactNode; title?: string }) {
  return (
    <div className="rounded border border-amber/40 bg-amber-wash p-3 text-sm text-ink">
      {title && <p className="font-semibold text-amber">{title}</p>}
      <div>{children}</div>
    </div>
  );
}
