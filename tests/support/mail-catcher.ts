import { simpleParser, type ParsedMail } from "mailparser";
import { SMTPServer } from "smtp-server";

// A real SMTP server inside the test process: the app sends over SMTP as it would to a
// provider, and tests read the messages it received.
export type CaughtMail = { to: string[]; subject: string; text: string; html: string; date: Date };

export class MailCatcher {
  readonly mails: CaughtMail[] = [];
  private server?: SMTPServer;

  constructor(readonly port: number) {}

  async start(): Promise<void> {
    this.server = new SMTPServer({
      authOptional: true,
      disabledCommands: ["STARTTLS"],
      logger: false,
      onData: (stream, _session, callback) => {
        simpleParser(stream)
          .then((m: ParsedMail) => {
            const to = (Array.isArray(m.to) ? m.to : m.to ? [m.to] : []).flatMap((a) =>
              a.value.map((v) => (v.address ?? "").toLowerCase()),
            );
            this.mails.push({
              to,
              subject: m.subject ?? "",
              text: m.text ?? "",
              html: typeof m.html === "string" ? m.html : "",
              date: new Date(),
            });
            callback();
          })
          .catch((err: Error) => callback(err));
      },
    });
    await new Promise<void>((resolve, reject) => {
      this.server!.once("error", reject);
      this.server!.listen(this.port, "127.0.0.1", () => resolve());
    });
  }

  async stop(): Promise<void> {
    if (this.server) await new Promise<void>((resolve) => this.server!.close(() => resolve()));
  }

  /** Waits for a mail to `address` that matches, newest first. */
  async waitFor(
    address: string,
    match: (m: CaughtMail) => boolean = () => true,
    timeoutMs = 15_000,
  ): Promise<CaughtMail> {
    const deadline = Date.now() + timeoutMs;
    while (Date.now() < deadline) {
      const found = [...this.mails].reverse().find((m) => m.to.includes(address.toLowerCase()) && match(m));
      if (found) return found;
      await new Promise((r) => setTimeout(r, 100));
    }
    throw new Error(
      `no mail to ${address} within ${timeoutMs} ms (have: ${this.mails.map((m) => `${m.to.join(",")}: ${m.subject}`).join("; ") || "none"})`,
    );
  }

  /** The first link into the app found in a mail's text. */
  static linkIn(mail: CaughtMail): string {
    const url = mail.text.match(/https?:\/\/\S+/)?.[0];
    if (!url) throw new Error(`no link in mail "${mail.subject}"`);
    return url;
  }
}
