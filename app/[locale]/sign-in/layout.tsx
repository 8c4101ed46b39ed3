import type { ReactNode } from "react";
import { ClientMessages } from "@/components/client-messages";

// The messages the sign-in pages' client components read (components/client-messages.tsx).
export default function Layout({ children }: { children: ReactNode }) {
  return <ClientMessages namespaces={["SignIn"]}>{children}</ClientMessages>;
}
