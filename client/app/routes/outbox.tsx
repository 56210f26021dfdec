import { useOutbox } from "../../features/outbox/api/get-outbox.ts";
import { OutboxList } from "../../features/outbox/components/outbox-list.tsx";
import { ErrorNote, Loading } from "../../components/ui/states.tsx";
import { ApiError } from "../../lib/api-client.ts";

export function Component() {
  const outbox = useOutbox();
  return (
    <div>
      <h1 className="text-3xl mb-2">Outbox</h1>
      <p className="mb-6 max-w-prose text-ink-soft">
        E-mail the application sent while running locally. It went to the local mail sink, not to anyone's inbox; this page exists only in
        local development.
      </p>
      {outbox.isPending ? (
        <Loading what="messages" />
      ) : outbox.isError ? (
        outbox.error instanceof ApiError && outbox.error.status === 403 ? (
          <p className="text-ink-soft">The outbox is switched off on this server (it is only available with the local mail sink).</p>
        ) : (
          <ErrorNote error={outbox.error} retry={() => void outbox.refetch()} />
        )
      ) : (
        <OutboxList messages={outbox.data.messages} />
      )}
    </div>
  );
}
