import "server-only";
import type { PublishMail } from "@/db/queries/reports";
import { env } from "@/lib/env";
import { toLocale, translator } from "@/lib/i18n/translator";

/** The e-mail every participant gets when a report version is published, in their language. */
export const publishMail: PublishMail = (report, person) => {
  const locale = toLocale(person.locale);
  const t = translator(locale, "Results");
  const link = `${env().APP_URL}/${locale}/events/${report.eventSlug}/reports/${report.version}`;
  const values = { event: report.eventName, version: report.version, link };
  return { to: person.email, kind: "report_published", locale, subject: t("mail.subject", values), text: t("mail.text", values) };
};
