// Next calls register() once when a server starts (not during `next build`). Reading the
// settings here makes a server with invalid or, in production, unsafe settings (lib/env.ts,
// productionProblems) stop with the reason before it serves a page; Next itself would only
// log the error and answer every request with an error page.
export async function register(): Promise<void> {
  if (process.env.NEXT_RUNTIME !== "nodejs") return;
  const { env } = await import("./lib/env");
  try {
    env();
  } catch (err) {
    console.error(`[ecotone] ${err instanceof Error ? err.message : String(err)}`);
    process.exit(1);
  }
}
