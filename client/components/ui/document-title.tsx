import { useEffect } from "react";
import { useLocation } from "react-router-dom";

const SITE = "Dragoman";

/**
 * Gives every page its own document title, taken from its first heading ("Translate a bound ·
 * Dragoman", a theory's name on its page; or the heading's data-page-title), so a new route gets one without extra wiring. It follows
 * the heading as lazy pages and their data arrive.
 */
export function DocumentTitle({ home }: { home: string }) {
  const { pathname } = useLocation();
  useEffect(() => {
    const main = document.getElementById("main");
    const update = () => {
      if (pathname === "/") {
        document.title = `${SITE}: ${home}`;
        return;
      }
      // A page may name itself more fully than its heading (data-page-title), e.g. "Review of submission 3: …".
      const h1 = main?.querySelector("h1");
      const heading = (h1?.dataset.pageTitle ?? h1?.textContent)?.replace(/\s+/g, " ").trim();
      const next = heading ? `${heading} · ${SITE}` : SITE;
      if (document.title !== next) document.title = next;
    };
    update();
    if (!main) return;
    const observer = new MutationObserver(update);
    observer.observe(main, { childList: true, subtree: true, characterData: true });
    return () => observer.disconnect();
  }, [pathname, home]);
  return null;
}
