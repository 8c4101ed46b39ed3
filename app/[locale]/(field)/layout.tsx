import type { ReactNode } from "react";
import { ClientMessages } from "@/components/client-messages";

// The messages the field log's client components read (components/client-messages.tsx).
export default function Layout({ children }: { children: ReactNode }) {
  return (
    <ClientMessages namespaces={["FieldLog", "FieldSync", "ReviewDesk", "Map", "StateMark"]}>{children}</ClientMessages>
  );
}
