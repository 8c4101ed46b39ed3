import type { ReactNode } from "react";
import { ClientMessages } from "@/components/client-messages";

// The messages the results pages' client components read (the report's map, the live board's state names; components/client-messages.tsx).
export default function Layout({ children }: { children: ReactNode }) {
  return <ClientMessages namespaces={["Map", "StateMark"]}>{children}</ClientMessages>;
}
