/** Stored-script payloads: a script tag, an image whose error handler runs, and an attribute break-out into an SVG. */
export const HOSTILE = `<script>window.__xss=1</script><img src=x onerror="window.__xss=1">"><svg onload=window.__xss=1>`;
/** The same attack within 60 characters, for short fields such as sample labels. */
export const HOSTILE_SHORT = `"><img src=x onerror=window.__xss=1>`;
/** A reason that a spreadsheet would run as a formula, over two lines, with markup after it. */
export const FORMULA_REASON = `=HYPERLINK("https://evil.example","open")\nwithdrawn ${HOSTILE_SHORT}`;
