import { notFound } from "next/navigation";

// Unknown addresses inside a locale get the localised not-found page.
export default function CatchAll() {
  notFound();
}
