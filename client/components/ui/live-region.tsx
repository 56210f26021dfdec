import { useEffect, useState } from "react";

/**
 * One polite live region for the whole app: a result that arrives (a translation, a saved sheet) is
 * read out by screen readers through announce(), without moving focus.
 */
type Listener = (message: string) => void;
const listeners = new Set<Listener>();

export function announce(message: string): void {
  for (const l of listeners) l(message);
}

export function LiveRegion() {
  const [message, setMessage] = useState("");
  useEffect(() => {
    // Clearing first makes a repeated identical message be read again.
    const listener: Listener = (m) => {
      setMessage("");
      window.setTimeout(() => setMessage(m), 50);
    };
    listeners.add(listener);
    return () => {
      listeners.delete(listener);
    };
  }, []);
  return (
    <div role="status" aria-live="polite" aria-atomic="true" className="sr-only" data-testid="live-region">
      {message}
    </div>
  );
}
