import "server-only";
import type { OutboxMail } from "@/db/queries/mail-queue";
import type { OrganisationRequestRow } from "@/db/queries/organisations";
import { env } from "@/lib/env";
import { toLocale, translator } from "@/lib/i18n/translator";
import { mailHtml } from "@/server/mail/html";

// The mails of an organisation request: to the site admins when it arrives, and to the
// person who asked when it is decided. Both go through the outbox.

export function newRequestMail(
  admin: { email: string; locale: string },
  request: { name: string; contactEmail: string; country: string; description: string; requester: string },
): OutboxMail {
  const locale = toLocale(admin.locale);
  const t = translator(locale, "Mail");
  const url = `${env().APP_URL}/${locale}/admin/organisations`;
  const paragraphs = [
    t("organisationRequest.intro", { requester: request.requester, name: request.name }),
    t("organisationRequest.details", {
      contact: request.contactEmail,
      country: request.country,
      description: request.description,
    }),
  ];
  return {
    to: admin.email,
    kind: "organisation_request",
    locale,
    subject: t("organisationRequest.subject", { name: request.name }),
    text: `${paragraphs.join("\n\n")}\n\n${url}\n\n${t("footer")}`,
    html: mailHtml({
      lang: locale,
      paragraphs,
      action: { label: t("organisationRequest.action"), url },
      footer: t("footer"),
    }),
  };
}

export function decisionMail(request: OrganisationRequestRow, userLocale: string): OutboxMail {
  const locale = toLocale(userLocale);
  const t = translator(locale, "Mail");
  const approved = request.state === "approved";
  const url = `${env().APP_URL}/${locale}/setup`;
  const paragraphs = approved
    ? [t("organisationDecision.approved", { name: request.name })]
    : [
        t("organisationDecision.declined", { name: request.name }),
        t("organisationDecision.reason", { reason: request.reason }),
      ];
  return {
    to: request.requesterEmail,
    kind: "organisation_decision",
    locale,
    subject: t(approved ? "organisationDecision.subjectApproved" : "organisationDecision.subjectDeclined", {
      name: request.name,
    }),
    text: `${paragraphs.join("\n\n")}${approved ? `\n\n${url}` : ""}\n\n${t("footer")}`,
    html: mailHtml({
      lang: locale,
      paragraphs,
      ...(approved ? { action: { label: t("organisationDecision.action"), url } } : {}),
      footer: t("footer"),
    }),
  };
}
