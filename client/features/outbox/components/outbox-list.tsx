import { useState } from "react";
import type { z } from "zod";
import type { outboxMessageSchema } from "../../../../common/catalogue.ts";
import { Button } from "../../../components/ui/button.tsx";
import { formatDateTime } from "../../../../common/dates.ts";

type Message = z.infer<typeof outboxMessageSchema>;

function MessageItem({ m, index }: { m: Message; index: number }) {
  const [open, setOpen] = useState(index === 0);
  return (
    <li className="rounded border border-paper-edge bg-white/40" data-testid={`outbox-message-${index}`}>
      <div className="flex flex-wrap items-baseline gap-x-4 gap-y-1 px-3 py-2">
        <span className="tabular-nums text-sm text-ink-soft whitespace-nowrap">{formatDateTime(m.date)}</span>
        <span className="font-semibold grow">{m.subject}</span>
        <span className="text-sm font-mono text-ink-soft">to {m.to}</span>
        <Button kind="quiet" aria-expanded={open} onClick={() => setOpen(!open)}>
          {open ? "hide" : "read"}
        </Button>
      </div>
      {open && <pre className="border-t border-paper-edge px-3 py-2 whitespace-pre-wrap break-words font-mono text-xs">{m.text}</pre>}
    </li>
  );
}

/** Newest first, as the server sends them; the newest is open. */
export function OutboxList({ messages }: { messages: Message[] }) {
  if (messages.length === 0) return <p className="text-ink-soft">No messages yet. Submit something or decide on a submission to see its e-mail here.</p>;
  return (
    <ol className="flex flex-col gap-2">
      {messages.map((m, i) => (
        <MessageItem key={`${m.date}-${i}`} m={m} index={i} />
      ))}
    </ol>
  );
}
