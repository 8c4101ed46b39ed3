import type { ReactNode } from "react";
import { ClientMessages } from "@/components/client-messages";

// The messages the public pages' client components read (the map; components/client-messages.tsx).
export default function Layout({ children }: { children: ReactNode }) {
  return <ClientMessages namespaces={["Map"]}>{children}</ClientMessages>;
}
