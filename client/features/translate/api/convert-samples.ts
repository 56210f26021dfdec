import { useMutation } from "@tanstack/react-query";
import { samplesResponseSchema, type SamplesRequest } from "../../../../common/convert-samples.ts";
import { apiRequest } from "../../../lib/api-client.ts";
import { apiPaths } from "../../../lib/paths.ts";

/**
 * A posterior can hold 200 000 samples: as a query key it would be hashed on every render, so the
 * translation is a mutation (it writes nothing, so there is nothing to invalidate).
 */
export function useConvertSamples() {
  return useMutation({
    mutationKey: ["convert", "samples"],
    mutationFn: (request: SamplesRequest) => apiRequest(apiPaths.convertSamples(), samplesResponseSchema, { method: "POST", body: request }),
  });
}
