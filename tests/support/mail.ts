/** Read what the app sent, from maildev's HTTP API (the test stack's MAIL_INBOX_URL). */
export interface CaughtMail {
  id: string;
  subject: string;
  text?: string;
  html?: string;
  to: { address: string; name?: string }[];
  attachments?: { filename?: string; generatedFileName?: string; contentType: string }[];
}

function inbox(): string {
  const url = process.env.MAIL_INBOX_URL;
  if (!url) throw new Error('MAIL_INBOX_URL is not set; run tests through `npm test`.');
  return url;
}

export async function mailsTo(address: string): Promise<CaughtMail[]> {
  const res = await fetch(`${inbox()}/api/email?${new URLSearchParams({ 'to.address': address })}`);
  return (await res.json()) as CaughtMail[];
}

/** Wait until `address` has at least `count` mails matching `subject`, then return them. */
export async function waitForMails(address: string, options: { subject?: RegExp; count?: number; timeoutMs?: number } = {}): Promise<CaughtMail[]> {
  const deadline = Date.now() + (options.timeoutMs ?? 10_000);
  for (;;) {
    const mails = (await mailsTo(address)).filter((m) => !options.subject || options.subject.test(m.subject));
    if (mails.length >= (options.count ?? 1) || Date.now() > deadline) return mails;
    await new Promise((r) => setTimeout(r, 100));
  }
}

/** The text of an attachment by its original file name (maildev stores it under a generated name). */
export async function attachmentText(mail: CaughtMail, fileName: string): Promise<string> {
  const stored = mail.attachments?.find((a) => a.filename === fileName)?.generatedFileName;
  if (!stored) throw new Error(`no attachment named ${fileName} in "${mail.subject}"`);
  const res = await fetch(`${inbox()}/api/email/${mail.id}/attachment/${encodeURIComponent(stored)}`);
  if (!res.ok) throw new Error(`attachment ${fileName} not found (${res.status})`);
  return res.text();
}
