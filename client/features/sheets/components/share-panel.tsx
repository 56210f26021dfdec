import type { Sheet } from "../../../../common/sheets.ts";
import { Button } from "../../../components/ui/button.tsx";
import { ErrorNote } from "../../../components/ui/states.tsx";
import { paths } from "../../../lib/paths.ts";
import { useShareSheet, useUnshareSheet } from "../api/share-sheet.ts";

/** The read-only link: anyone holding it can read and export the sheet, never change it. */
export function SharePanel({ sheet }: { sheet: Sheet }) {
  const share = useShareSheet(sheet.id);
  const unshare = useUnshareSheet(sheet.id);
  const link = sheet.share_token ? `${window.location.origin}${paths.sharedSheet(sheet.share_token)}` : undefined;
  return (
    <section aria-labelledby="share-title" className="flex flex-col gap-2">
      <h2 id="share-title" className="text-xl">
        Share read-only
      </h2>
      {link ? (
        <>
          <p className="text-sm text-ink-soft">Anyone with this link can read and download the sheet, without signing in. Making a new link withdraws this one.</p>
          <input readOnly value={link} aria-label="Share link" className="w-full rounded border border-paper-edge bg-white/70 px-2 py-1 font-mono text-xs" data-testid="share-link" onFocus={(e) => e.target.select()} />
          <div className="flex gap-2">
            <Button onClick={() => share.mutate()} busy={share.isPending}>
              Make a new link
            </Button>
            <Button kind="danger" onClick={() => unshare.mutate()} busy={unshare.isPending}>
              Withdraw the link
            </Button>
          </div>
        </>
      ) : (
        <div>
          <Button onClick={() => share.mutate()} busy={share.isPending} data-testid="share-create">
            Make a share link
          </Button>
        </div>
      )}
      {(share.error ?? unshare.error) && <ErrorNote error={share.error ?? unshare.error} title="The share link could not be changed." />}
    </section>
  );
}
