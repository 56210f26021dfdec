import { isPhaseBound, type ConvertRequest } from "../../../common/convert.ts";
import { SaveToSheet } from "../../features/sheets/components/save-to-sheet.tsx";
import { RingdownPanel } from "../../features/ringdown/components/ringdown-panel.tsx";
import { EventsPanel } from "../../features/translate/components/events-panel.tsx";
import { SamplesPanel } from "../../features/translate/components/samples-panel.tsx";
import { SamplesJobPanel } from "../../features/jobs/components/samples-job-panel.tsx";
import { StackPanel } from "../../features/jobs/components/stack-panel.tsx";
import { TranslatePanel } from "../../features/translate/components/translate-panel.tsx";

function SaveSlot({ request }: { request: ConvertRequest }) {
  const bound = request.bound;
  if (!isPhaseBound(bound)) {
    return <p className="text-sm text-ink-faint">Sheets hold phase bounds (β at b, δφ_k) for now: amplitude and distance-ratio translations cannot be saved to a sheet yet.</p>;
  }
  return (
    <SaveToSheet
      what="this translation"
      payload={{
        kind: "translation",
        bound,
        binary: request.binary,
        ...(request.cosmology ? { cosmology: request.cosmology } : {}),
        ...(request.conventions ? { conventions: request.conventions } : {}),
      }}
    />
  );
}

/** The translate page: a measured bound in, a limit on every catalogued coupling out. */
export function Component() {
  return (
    <article className="flex flex-col gap-6">
      <header className="max-w-3xl">
        <h1 className="text-4xl leading-tight">Translate a bound</h1>
        <p className="mt-3 text-lg leading-relaxed text-ink-soft">
          Give a bound on a theory-agnostic deviation, the binary it was measured on, and the cosmology. Every accepted catalogue entry that enters at that b (or, for an amplitude
          bound, at that a) turns it into a limit on its coupling, with the conditions of its approximation checked at the limit.
        </p>
      </header>
      <TranslatePanel footer={(request) => <SaveSlot request={request} />} />
      <SamplesJobPanel />
      <StackPanel />
      <SamplesPanel />
      <EventsPanel />
      <RingdownPanel />
    </article>
  );
}
