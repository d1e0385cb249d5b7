/**
 * A request the server answered with 4xx: asking again cannot help, so the browser's queries do
 * not retry it and show its message at once (a crafted address with a bad filter, say).
 */
export class RequestRefused extends Error {}

/** Retry a failed query up to three times, unless the server refused the request itself. */
export function retryUnlessRefused(failureCount: number, error: unknown) {
  return failureCount < 3 && !(error instanceof RequestRefused);
}
