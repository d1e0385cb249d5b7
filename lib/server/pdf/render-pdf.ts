import "server-only";
import { spawn, type ChildProcess } from "node:child_process";
import { join } from "node:path";
import { env } from "@/lib/env";
import type { PdfJob } from "@/lib/pdf/jobs";
import { UserFacingError } from "@/lib/server/errors";

type Reply =
  | { ready: true }
  | { id: number; ok: true; bytes: Uint8Array }
  | { id: number; ok: false; message: string };

interface Pending {
  id: number;
  job: PdfJob;
  resolve: (bytes: Uint8Array) => void;
  reject: (error: Error) => void;
}

/**
 * Renders PDFs in one child process with a heap cap and a time limit, one job
 * at a time: a render that grows or hangs stays inside the worker, which is
 * killed and replaced, and every other PDF keeps working. Jobs queue in order.
 */
class PdfWorker {
  private child: ChildProcess | null = null;
  private queue: Pending[] = [];
  private current: (Pending & { timer: NodeJS.Timeout; child: ChildProcess }) | null = null;
  private nextId = 1;

  render(job: PdfJob): Promise<Uint8Array> {
    return new Promise((resolve, reject) => {
      this.queue.push({ id: this.nextId++, job, resolve, reject });
      this.pump();
    });
  }

  private spawn(): ChildProcess {
    const { PDF_MEMORY_MB } = env();
    // spawn, not fork: the bundler treats fork's argument as a module to bundle, and the worker
    // runs from the source tree under tsx like the scripts do.
    const worker = join(process.cwd(), "lib", "pdf", "worker.ts");
    const child = spawn(
      process.execPath,
      ["--import", "tsx", `--max-old-space-size=${PDF_MEMORY_MB}`, worker],
      {
        serialization: "advanced",
        stdio: ["ignore", "inherit", "inherit", "ipc"],
      },
    );
    child.on("message", (reply: Reply) => this.onReply(reply));
    child.on("exit", (code, signal) => this.onExit(child, code, signal));
    child.on("error", (error) => console.error("PDF worker:", error));
    // The server must be able to exit while an idle worker waits.
    child.unref();
    child.channel?.unref();
    return child;
  }

  private pump() {
    if (this.current || this.queue.length === 0) return;
    const next = this.queue.shift()!;
    this.child ??= this.spawn();
    const child = this.child;
    const timer = setTimeout(() => {
      this.fail(
        new UserFacingError(
          `This PDF took longer than ${env().PDF_TIMEOUT_SECONDS} s to render and was stopped. Other PDFs are not affected.`,
          { kind: "unavailable" },
        ),
      );
      if (this.child === child) this.retire();
    }, env().PDF_TIMEOUT_SECONDS * 1000);
    this.current = { ...next, timer, child };
    child.channel?.ref();
    child.send({ id: next.id, job: next.job });
  }

  private onReply(reply: Reply) {
    if ("ready" in reply || !this.current || reply.id !== this.current.id) return;
    const done = this.current;
    clearTimeout(done.timer);
    this.current = null;
    this.child?.channel?.unref();
    if (reply.ok) done.resolve(reply.bytes);
    else {
      console.error("PDF render failed:", reply.message);
      done.reject(
        new UserFacingError(
          "This record could not be rendered as a PDF. Other PDFs are not affected; the error is in the server log.",
          { kind: "invalid" },
        ),
      );
      // A failed layout leaves the renderer's layout engine in a broken state: start the next job afresh.
      this.retire();
    }
    this.pump();
  }

  private retire() {
    const child = this.child;
    this.child = null;
    child?.kill("SIGKILL");
  }

  private onExit(child: ChildProcess, code: number | null, signal: NodeJS.Signals | null) {
    if (this.child === child) this.child = null;
    // A worker retired after a failed job exits while the next job runs in its successor.
    if (this.current?.child === child) {
      console.error(`PDF worker stopped (code ${code}, signal ${signal}) while rendering.`);
      this.fail(
        new UserFacingError(
          "This record could not be rendered as a PDF: it needs more memory than a PDF may use. Other PDFs are not affected.",
          { kind: "too_large" },
        ),
      );
    }
    this.pump();
  }

  private fail(error: Error) {
    if (!this.current) return;
    clearTimeout(this.current.timer);
    this.current.reject(error);
    this.current = null;
  }
}

let worker: PdfWorker | undefined;

/** Renders a PDF outside the server's process; refuses with a plain message when the one document cannot be rendered. */
export function renderPdf(job: PdfJob): Promise<Uint8Array> {
  worker ??= new PdfWorker();
  return worker.render(job);
}
