import { zodResolver } from "@hookform/resolvers/zod";
import { useForm } from "react-hook-form";
import type { z } from "zod";
import { createTokenSchema } from "../../../../common/accounts.ts";
import { Button } from "../../../components/ui/button.tsx";
import { Field, TextInput } from "../../../components/ui/field.tsx";
import { Empty, ErrorNote, Loading } from "../../../components/ui/states.tsx";
import { ApiError } from "../../../lib/api-client.ts";
import { useCreateToken } from "../api/create-token.ts";
import { useTokens } from "../api/get-tokens.ts";
import { useRevokeToken } from "../api/revoke-token.ts";
import { formatDateTime } from "../../../../common/dates.ts";

const when = (iso: string | null) => (iso ? formatDateTime(iso) : "never");

/** Personal API tokens: make one (its secret is shown here once), see when each was last used, revoke. */
export function ApiTokensPanel() {
  const tokens = useTokens();
  const create = useCreateToken();
  const revoke = useRevokeToken();
  const form = useForm<z.input<typeof createTokenSchema>, unknown, z.output<typeof createTokenSchema>>({
    resolver: zodResolver(createTokenSchema),
    defaultValues: { name: "" },
  });

  const onSubmit = form.handleSubmit((values) =>
    create.mutate(values, {
      onSuccess: () => form.reset({ name: "" }),
      onError: (err) => {
        // The server's field errors land on the field they name.
        if (err instanceof ApiError && err.fields.name) form.setError("name", { message: err.fields.name });
      },
    }),
  );

  return (
    <div className="space-y-8">
      <form onSubmit={(e) => void onSubmit(e)} className="flex flex-wrap items-start gap-3" noValidate>
        <Field label="Name of the new token" hint="Say where it will be used, e.g. “cluster batch jobs”." error={form.formState.errors.name?.message} className="w-80">
          {(control) => <TextInput {...control} {...form.register("name")} data-testid="token-name" autoComplete="off" />}
        </Field>
        <Button type="submit" kind="primary" busy={create.isPending} data-testid="create-token" className="mt-[1.65rem]">
          Create token
        </Button>
      </form>

      {create.isError && !(create.error instanceof ApiError && create.error.fields.name) && <ErrorNote title="The token was not created." error={create.error} />}
      {create.data && (
        <div role="status" className="rounded border border-moss/40 bg-moss-wash p-4" data-testid="new-token">
          <p className="font-semibold text-moss">Token “{create.data.name}” created. Copy it now: it will not be shown again.</p>
          <code className="mt-2 block break-all rounded bg-white/70 p-2 font-mono text-sm select-all">{create.data.token}</code>
          <p className="mt-2 text-sm text-ink-soft">
            Send it as <code className="font-mono">Authorization: Bearer &lt;token&gt;</code>. It acts with your roles as they are at each request.
          </p>
        </div>
      )}

      <section>
        <h2 className="text-xl mb-3">Your tokens</h2>
        {revoke.isError && <ErrorNote title="The token was not revoked." error={revoke.error} />}
        {tokens.isPending ? (
          <Loading what="your tokens" />
        ) : tokens.isError ? (
          <ErrorNote error={tokens.error} retry={() => void tokens.refetch()} />
        ) : tokens.data.length === 0 ? (
          <Empty>You have no API tokens.</Empty>
        ) : (
          <ul className="divide-y divide-paper-edge rounded border border-paper-edge bg-white/40" data-testid="token-list">
            {tokens.data.map((t) => (
              <li key={t.id} className="flex flex-wrap items-baseline gap-x-6 gap-y-1 px-3 py-2">
                <span className="font-semibold">{t.name}</span>
                <code className="font-mono text-sm text-ink-soft">{t.token_start}…</code>
                <span className="text-sm text-ink-faint">created {when(t.created_at)}</span>
                <span className="text-sm text-ink-faint">last used {when(t.last_used_at)}</span>
                <Button kind="danger" className="ml-auto" busy={revoke.isPending && revoke.variables === t.id} onClick={() => revoke.mutate(t.id)}>
                  Revoke
                </Button>
              </li>
            ))}
          </ul>
        )}
      </section>
    </div>
  );
}
