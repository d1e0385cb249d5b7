// Vitest runs server modules outside Next; the real package throws outside a server bundle.
export {};
