/** Escape text for HTML e-mail bodies: names and other user text are never markup. */
export function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
}

export interface MailContent {
  subject: string;
  /** Paragraphs of plain text; each becomes a <p> in the HTML version. */
  paragraphs: string[];
  action?: { label: string; url: string };
}

const FOOTER = 'Saddlestep does not diagnose. If pain is severe, at rest or at night, or comes with numbness, swelling or after a crash, see a clinician.';

/** Both versions of an e-mail from one content object, in the Saddlestep palette. */
export function renderMail(content: MailContent): { subject: string; text: string; html: string } {
  const text = [...content.paragraphs, content.action ? `${content.action.label}: ${content.action.url}` : '', '—', FOOTER].filter(Boolean).join('\n\n');
  const html = `<!doctype html><html><body style="margin:0;background:#F6F1E9;font-family:Lato,Arial,sans-serif;color:#1E2329">
<div style="max-width:560px;margin:0 auto;padding:24px">
<p style="font-size:20px;font-weight:700;color:#1F4D45;margin:0 0 16px">Saddlestep</p>
${content.paragraphs.map((p) => `<p style="font-size:16px;line-height:1.5">${escapeHtml(p)}</p>`).join('\n')}
${content.action ? `<p><a href="${escapeHtml(content.action.url)}" style="display:inline-block;background:#1F4D45;color:#fff;padding:10px 18px;border-radius:6px;text-decoration:none">${escapeHtml(content.action.label)}</a></p>` : ''}
<p style="font-size:12px;color:#5b6167;margin-top:32px">${escapeHtml(FOOTER)}</p>
</div></body></html>`;
  return { subject: content.subject, text, html };
}
