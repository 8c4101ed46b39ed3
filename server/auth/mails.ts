import "server-only";
import type { Locale } from "@/lib/i18n/routing";
import { translator } from "@/lib/i18n/translator";
import { mailHtml } from "@/server/mail/html";

export function signInMail(locale: Locale, url: string) {
  const t = translator(locale, "Mail");
  const paragraphs = [t("signIn.intro"), t("signIn.expiry"), t("signIn.ignore")];
  return {
    subject: t("signIn.subject"),
    text: `${paragraphs[0]}\n\n${url}\n\n${paragraphs.slice(1).join("\n\n")}\n\n${t("footer")}`,
    html: mailHtml({ lang: locale, paragraphs, action: { label: t("signIn.action"), url }, footer: t("footer") }),
  };
}

/** The answer to a sign-in link asked for an address with no account and no invitation. */
export function noAccountMail(locale: Locale) {
  const t = translator(locale, "Mail");
  const paragraphs = [t("noAccount.intro"), t("noAccount.howToJoin"), t("noAccount.ignore")];
  return {
    subject: t("noAccount.subject"),
    text: `${paragraphs.join("\n\n")}\n\n${t("footer")}`,
    html: mailHtml({ lang: locale, paragraphs, footer: t("footer") }),
  };
}

export function invitationMail(
  locale: Locale,
  opts: { url: string; eventName: string; role: string; inviter: string | null },
) {
  const t = translator(locale, "Mail");
  const intro = opts.inviter
    ? t("invitation.intro", { inviter: opts.inviter, event: opts.eventName, role: opts.role })
    : t("invitation.joinIntro", { event: opts.eventName, role: opts.role });
  const paragraphs = [intro, t("invitation.expiry")];
  return {
    // Joining through a join link is the person's own request: its mail confirms, it does not invite.
    subject: opts.inviter
      ? t("invitation.subject", { event: opts.eventName })
      : t("invitation.joinSubject", { event: opts.eventName }),
    text: `${paragraphs[0]}\n\n${opts.url}\n\n${paragraphs[1]}\n\n${t("footer")}`,
    html: mailHtml({
      lang: locale,
      paragraphs,
      action: { label: t("invitation.action"), url: opts.url },
      footer: t("footer"),
    }),
  };
}
