import { useState } from "react";
import { Button } from "../../../components/ui/button.tsx";
import { ErrorNote } from "../../../components/ui/states.tsx";
import { useWithdrawSubmission } from "../api/save-submission.ts";

/** Withdrawing cannot be undone, so it asks once more before sending. */
export function WithdrawButton({ id, onDone }: { id: number; onDone: () => void }) {
  const withdraw = useWithdrawSubmission();
  const [asking, setAsking] = useState(false);
  return (
    <div className="flex flex-wrap items-center gap-3 text-sm">
      {asking ? (
        <>
          <span>Withdraw submission {id}? It cannot be sent again afterwards.</span>
          <Button kind="danger" busy={withdraw.isPending} onClick={() => withdraw.mutate(id, { onSuccess: onDone })}>
            Yes, withdraw it
          </Button>
          <Button kind="quiet" onClick={() => setAsking(false)}>
            Keep it
          </Button>
        </>
      ) : (
        <Button kind="danger" onClick={() => setAsking(true)}>
          Withdraw…
        </Button>
      )}
      {withdraw.isError && <ErrorNote error={withdraw.error} title="It was not withdrawn." />}
    </div>
  );
}
