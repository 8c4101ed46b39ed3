import "server-only";
import type { DigestItem, DigestRecipient, RenderedMail } from "@/db/queries/review-digest";
import { env } from "@/lib/env";
import { toLocale, translator } from "@/lib/i18n/translator";
import { escapeHtml } from "@/server/mail/html";
import { formatEventDateTime } from "@/lib/time/regional";
import { REJECT_REASONS, type RejectReason } from "@/lib/domain";

// The volunteer's digest of review decisions, in their own language, times in each event's
// time zone (saying so). Every value from people (questions, notes) is escaped in the HTML.
export function renderDigest(to: DigestRecipient, items: DigestItem[]): RenderedMail {
  const locale = toLocale(to.locale);
  const t = translator(locale, "ReviewDigest");
  const tReason = translator(locale, "ReviewDesk");
  const lines = items.map((it) => {
    // The reader's language, written as the event's region writes it (en + Europe/London: 21 Jun 2026, 15:15).
    const when = formatEventDateTime(it.observedAt, locale, it.timeZone, { dateStyle: "medium", timeStyle: "short" });
    const what = it.toTaxon ?? it.fromTaxon ?? it.description;
    const subject = t("record", { what, count: it.count, when, zone: it.timeZone, event: it.eventName });
    let line: string;
    if (it.taxonChanged && it.fromState === it.toState)
      line = t("reidentified", { subject, from: it.fromTaxon ?? it.description, to: it.toTaxon ?? "" });
    else if (it.toState === "approved") line = t("approved", { subject });
    else if (it.toState === "rejected") {
      const reason = (REJECT_REASONS as readonly string[]).includes(it.reason)
        ? tReason(`reasons.${it.reason as RejectReason}`)
        : it.reason;
      line = t("rejected", { subject, reason });
    } else if (it.toState === "returned") line = t("returned", { subject, question: it.message });
    else line = t("other", { subject });
    if (it.message && it.toState !== "returned") line += `\n  ${t("note", { message: it.message })}`;
    return line;
  });
  const subject = t("subject", { n: items.length });
  const intro = t("intro", { name: to.name ?? to.email, n: items.length });
  const link = `${env().APP_URL}/${locale}`;
  const text = `${intro}\n\n${lines.map((l) => `- ${l}`).join("\n")}\n\n${t("answer")}\n${link}\n\n${t("footer")}`;
  const html =
    `<!doctype html><html lang="${locale}"><body style="font-family:system-ui,sans-serif;background:#f8f5ec;color:#1a1f1b;padding:24px">` +
    `<div style="max-width:600px;margin:auto"><p>${escapeHtml(intro)}</p><ul>${lines.map((l) => `<li style="margin:0 0 10px;white-space:pre-line">${escapeHtml(l)}</li>`).join("")}</ul>` +
    `<p><a href="${escapeHtml(link)}" style="color:#1b4a35;font-weight:bold">${escapeHtml(t("answer"))}</a></p>` +
    `<p style="color:#3d463f;font-size:13px">${escapeHtml(t("footer"))}</p></div></body></html>`;
  return { subject, text, html };
}
