import Link from "next/link";
import "./globals.css";

// Reached only for addresses outside any locale; the localised one is [locale]/not-found.
export default function GlobalNotFound() {
  return (
    <html lang="en">
      <body className="bg-paper p-8 font-sans text-ink">
        <h1 className="text-2xl font-bold">Page not found</h1>
        <p className="mt-2">
          <Link className="text-reed-700 underline" href="/en">
            Ecotone — back to events
          </Link>
        </p>
      </body>
    </html>
  );
}
