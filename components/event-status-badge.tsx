import { getTranslations } from "next-intl/server";

const styles = {
  draft: { box: "border-ink-soft text-ink-soft", dot: "○" },
  open: { box: "border-reed-600 bg-reed-50 text-reed-800", dot: "●" },
  closed: { box: "border-heath-600 bg-heath-50 text-heath-800", dot: "■" },
} as const;

// Told apart by word and symbol as well as colour.
export async function EventStatusBadge({ status }: { status: keyof typeof styles }) {
  const t = await getTranslations("Home.status");
  const s = styles[status];
  return (
    <span className={`inline-flex items-center gap-1 rounded-full border px-2 py-0.5 text-sm font-semibold ${s.box}`}>
      <span aria-hidden="true">{s.dot}</span>
      {t(status)}
    </span>
  );
}
