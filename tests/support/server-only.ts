// Vitest runs outside Next; the "server-only" guard has nothing to guard there.
export {};
