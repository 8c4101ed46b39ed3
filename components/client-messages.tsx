import { NextIntlClientProvider } from "next-intl";
import { getMessages } from "next-intl/server";
import type { ReactNode } from "react";
import type en from "@/messages/en.json";

export type Namespace = keyof typeof en;

/**
 * Gives the client components below only the namespaces they read: every message sent to the
 * browser is part of the page's HTML and is parsed before the page answers (issue 18: the
 * whole catalogue, 95 KB in English, went with every page). A nested provider replaces the
 * messages of the one above it, so a subtree lists everything its client components read.
 */
export async function ClientMessages({ namespaces, children }: { namespaces: Namespace[]; children: ReactNode }) {
  const all = await getMessages();
  const picked = Object.fromEntries(namespaces.filter((n) => n in all).map((n) => [n, all[n]]));
  return <NextIntlClientProvider messages={picked}>{children}</NextIntlClientProvider>;
}
