export interface CaughtMail {
  subject: string;
  to: Array<{ address: string }>;
  text: string;
}

/** Polls the mail catcher's REST API (maildev, a real SMTP server) until a mail with this subject has arrived. */
export async function mailWithSubject(webPort: number | string, subject: string): Promise<CaughtMail> {
  for (let attempt = 0; attempt < 60; attempt++) {
    const mails = (await (await fetch(`http://127.0.0.1:${webPort}/api/email`)).json()) as CaughtMail[];
    const found = mails.find((mail) => mail.subject === subject);
    if (found) return found;
    await new Promise((done) => setTimeout(done, 500));
  }
  throw new Error(`no mail "${subject}" arrived`);
}
