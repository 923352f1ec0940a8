/**
 * Worker half of parallel sampling: builds the row sampler from its generated source text (made by
 * `compile.ts` from a checked expression tree) and fills its share of rows in shared memory.
 *
 * @module
 */
import type { RowSampler } from "./compile.ts";
import type { WorkerJob } from "./sample.ts";

self.onmessage = (event: MessageEvent<WorkerJob>) => {
  try {
    const job = event.data;
    const run = new Function(job.source)() as RowSampler;
    const outputs = job.buffers.map((b) => new Float64Array(b));
    run(job.x0, job.hx, job.nx, job.y0, job.hy, job.j0, job.j1, outputs);
    self.postMessage({ ok: true });
  } catch (error) {
    self.postMessage({ ok: false, error: error instanceof Error ? error.message : String(error) });
  }
};
