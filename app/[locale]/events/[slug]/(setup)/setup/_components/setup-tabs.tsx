"use client";

import { Link, usePathname } from "@/lib/i18n/navigation";

/** The set-up tabs, the open one marked (aria-current and a filled tab), as a layout cannot know its page. */
export function SetupTabs({
  slug,
  label,
  tabs,
}: {
  slug: string;
  label: string;
  tabs: { part: string; name: string }[];
}) {
  const pathname = usePathname();
  const base = `/events/${slug}/setup`;
  return (
    <nav aria-label={label} className="flex flex-wrap gap-1 border-b-2 border-reed-300">
      {tabs.map(({ part, name }) => {
        const href = part ? `${base}/${part}` : base;
        const current = pathname === href;
        return (
          <Link
            key={part}
            href={href}
            aria-current={current ? "page" : undefined}
            className={`inline-flex min-h-touch items-center rounded-t-lg border-2 border-b-0 px-4 font-semibold ${
              current ? "border-reed-700 bg-reed-700 text-white" : "border-reed-300 text-reed-800 hover:bg-reed-50"
            }`}
          >
            {name}
          </Link>
        );
      })}
    </nav>
  );
}
