/**
 * The content security policy for one response: a per-request nonce so Next's
 * own inline scripts run and nothing injected does, and no framing. HSTS only
 * in production over HTTPS (a development server on http must stay reachable).
 */
export function securityHeaders(input: { nonce: string; dev: boolean; https: boolean }): {
  csp: string;
  hsts: string | null;
} {
  const csp = [
    "default-src 'self'",
    `script-src 'self' 'nonce-${input.nonce}' 'strict-dynamic'${input.dev ? " 'unsafe-eval'" : ""}`,
    // The rich-text editor and charts set inline style attributes.
    "style-src 'self' 'unsafe-inline'",
    "img-src 'self' blob: data:",
    "font-src 'self'",
    "connect-src 'self'",
    "object-src 'none'",
    "base-uri 'self'",
    "form-action 'self'",
    "frame-ancestors 'none'",
    ...(input.https ? ["upgrade-insecure-requests"] : []),
  ].join("; ");
  return { csp, hsts: input.https && !input.dev ? "max-age=63072000; includeSubDomains" : null };
}
