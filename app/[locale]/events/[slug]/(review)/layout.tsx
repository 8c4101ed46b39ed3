import type { ReactNode } from "react";
import { ClientMessages } from "@/components/client-messages";

// The messages the review desk's and paper sheets' client components read (components/client-messages.tsx).
export default function Layout({ children }: { children: ReactNode }) {
  return (
    <ClientMessages namespaces={["ReviewDesk", "StateMark", "TaxonGroup", "Map", "PaperSheets", "Setup"]}>
      {children}
    </ClientMessages>
  );
}
