import { spawn, type ChildProcess } from "node:child_process";
import { createRequire } from "node:module";

/** A child in its own process group, so the whole group can be killed at once, with its output kept for failures. */
export interface Child {
  process: ChildProcess;
  output: () => string;
  exited: Promise<number | null>;
}

export function startChild(
  command: string,
  args: string[],
  env: NodeJS.ProcessEnv,
  onLine?: (line: string) => void,
): Child {
  const child = spawn(command, args, { env, detached: true, stdio: ["ignore", "pipe", "pipe"] });
  let output = "";
  let partial = "";
  child.stdout!.on("data", (chunk: Buffer) => {
    output += chunk;
    const lines = (partial + chunk.toString()).split("\n");
    partial = lines.pop() ?? "";
    for (const line of lines) onLine?.(line);
  });
  child.stderr!.on("data", (chunk: Buffer) => (output += chunk));
  const exited = new Promise<number | null>((resolve) => child.on("exit", (code) => resolve(code)));
  return { process: child, output: () => output, exited };
}

/** `next start` of the production build, bound to 127.0.0.1. */
export function startNextServer(port: number, env: NodeJS.ProcessEnv): Child {
  const next = createRequire(import.meta.url).resolve("next/dist/bin/next");
  return startChild(process.execPath, [next, "start", "-H", "127.0.0.1", "-p", String(port)], env);
}

export function killGroup(child: Child, signal: NodeJS.Signals) {
  if (child.process.exitCode === null && child.process.pid) {
    try {
      process.kill(-child.process.pid, signal);
    } catch {
      // the group is already gone
    }
  }
  return child.exited;
}

/** Waits until the server answers its sign-in page; returns the milliseconds it took. */
export async function waitUntilServing(baseUrl: string, child: Child, timeoutMs = 60_000) {
  const started = performance.now();
  while (performance.now() - started < timeoutMs) {
    if (child.process.exitCode !== null)
      throw new Error(`The server exited before serving:\n${child.output()}`);
    try {
      if ((await fetch(`${baseUrl}/sign-in`)).ok) return performance.now() - started;
    } catch {
      // not listening yet
    }
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`The server did not answer within ${timeoutMs} ms:\n${child.output()}`);
}
