/**
 * The PDF worker: a child process of the server that renders one job at a time.
 * A document that exhausts its heap, overflows the stack or hangs takes down
 * only this process; the server answers that one request with an error and
 * starts a fresh worker for the next.
 */
import { renderJob, type PdfJob } from "./jobs";

type Request = { id: number; job: PdfJob };

process.on("message", async (message: Request) => {
  try {
    const bytes = await renderJob(message.job);
    process.send!({ id: message.id, ok: true, bytes: new Uint8Array(bytes) });
  } catch (error) {
    process.send!({
      id: message.id,
      ok: false,
      message: error instanceof Error ? error.message : String(error),
    });
  }
});
process.send!({ ready: true });
