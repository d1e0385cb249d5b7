// Stands in for the "server-only" marker in scripts run outside Next.js.
