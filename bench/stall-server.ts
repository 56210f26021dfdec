// Child process of bench/stall.bench.ts: the real server, plus an event-loop delay monitor that the
// parent reads over IPC. Nothing here is reachable over HTTP.
import { monitorEventLoopDelay } from "node:perf_hooks";
import { parseConfig } from "../server/config.ts";
import { startServer } from "../server/index.ts";

const histogram = monitorEventLoopDelay({ resolution: 10 });
histogram.enable();
const running = await startServer(parseConfig());
await running.server.listening;
process.send?.({ type: "listening", url: running.url });
process.on("message", (msg: { type: string }) => {
  if (msg.type === "reset") {
    histogram.reset();
    process.send?.({ type: "reset" });
  } else if (msg.type === "report") {
    const ms = (ns: number) => ns / 1e6;
    process.send?.({ type: "report", max: ms(histogram.max), p99: ms(histogram.percentile(99)), mean: ms(histogram.mean) });
  } else if (msg.type === "stop") {
    void running.close().then(() => process.exit(0));
  }
});
