import { getModels } from "@/models";
import type { Actor } from "@/lib/http/actor";
import { findOwnRun } from "./service";
import { isFinished } from "./status";
import { toRunView } from "./serialize";


const POLL_MS = 500;
const KEEPALIVE_MS = 15_000;

function frame(event: string, data: unknown, id?: number): string {
  return `${id !== undefined ? `id: ${id}\n` : ""}event: ${event}\ndata: ${JSON.stringify(data)}\n\n`;
}

/**
 * Server-sent events for one run: a `progress` event ({ id, status, progress }) whenever either changes,
 * then one `end` event with the whole run, then the stream closes. The run row is read every 0.5 s, so
 * this works whichever process runs the job. Checks the run exists for this user before streaming.
 */
export async function runEventStream(user: Actor, runId: number, signal: AbortSignal): Promise<ReadableStream<Uint8Array>> {
  await findOwnRun(user, runId);
  const { Run } = getModels();
  const enc = new TextEncoder();
  let timer: NodeJS.Timeout | undefined;
  let closed = false;

  return new ReadableStream<Uint8Array>({
    start(controller) {
      let last = "";
      let seq = 0;
      let lastSent = Date.now();
      const close = () => {
        if (closed) return;
        closed = true;
        if (timer) clearTimeout(timer);
        try {
          controller.close();
        } catch {
          // already closed by the client
        }
      };
      signal.addEventListener("abort", close, { once: true });
      controller.enqueue(enc.encode(`retry: 2000\n\n`));

      const tick = async () => {
        if (closed) return;
        try {
          const run = await Run.findByPk(runId);
          if (!run || run.organisationId !== user.organisationId) {
            controller.enqueue(enc.encode(frame("end", { id: runId, status: "deleted" }, ++seq)));
            return close();
          }
          const key = `${run.status}|${run.progress}`;
          if (key !== last) {
            last = key;
            lastSent = Date.now();
            controller.enqueue(enc.encode(frame("progress", { id: run.id, status: run.status, progress: run.progress }, ++seq)));
          } else if (Date.now() - lastSent > KEEPALIVE_MS) {
            lastSent = Date.now();
            controller.enqueue(enc.encode(`: keep-alive\n\n`));
          }
          if (isFinished(run.status)) {
            controller.enqueue(enc.encode(frame("end", toRunView(run), ++seq)));
            return close();
          }
        } catch (err) {
          if (closed) return;
          console.error(`run ${runId}: event stream failed`, err);
          controller.enqueue(enc.encode(frame("error", { message: "Could not read the run." })));
          return close();
        }
        timer = setTimeout(tick, POLL_MS);
      };
      void tick();
    },
    cancel() {
      closed = true;
      if (timer) clearTimeout(timer);
    },
  });
}
