// Sends Sheaf's e-mail through nodemailer (SMTP; the local catcher in development and tests).
import nodemailer from 'nodemailer';

export interface OutgoingMail {
  to: string;
  subject: string;
  text: string;
  html: string;
}

export interface Mailer {
  send(mail: OutgoingMail): Promise<void>;
}

export function createSmtpMailer(options: { host: string; port: number; from: string }): Mailer {
  const transport = nodemailer.createTransport({
    host: options.host,
    port: options.port,
    secure: false,
    ignoreTLS: true,
    connectionTimeout: 5000,
  });
  return {
    async send(mail) {
      await transport.sendMail({ from: options.from, ...mail });
    },
  };
}

/** Escapes text for the HTML part of an e-mail. */
export function escapeHtml(value: string): string {
  return value
    .replace(/&/g, '&amp;')
    .replace(/</g, '&lt;')
    .replace(/>/g, '&gt;')
    .replace(/"/g, '&quot;')
    .replace(/'/g, '&#39;');
}

/** Builds the text and HTML parts of a plain Sheaf e-mail with one call-to-action link. */
export function composeMail(input: {
  to: string;
  subject: string;
  paragraphs: string[];
  link?: { label: string; url: string };
  footer?: string;
}): OutgoingMail {
  const footer =
    input.footer ??
    'Sent by Sheaf for your grower network. If this was not meant for you, ignore it.';
  const text = [
    ...input.paragraphs,
    ...(input.link ? [`${input.link.label}: ${input.link.url}`] : []),
    '',
    footer,
  ].join('\n\n');
  const html = `<!doctype html><html><body style="font-family: sans-serif; color: #1f2a1c; max-width: 560px;">
${input.paragraphs.map((p) => `<p>${escapeHtml(p)}</p>`).join('\n')}
${input.link ? `<p><a href="${escapeHtml(input.link.url)}" style="background:#2f5d3a;color:#fff;padding:10px 16px;border-radius:6px;text-decoration:none;">${escapeHtml(input.link.label)}</a></p><p style="font-size:12px;color:#555;">${escapeHtml(input.link.url)}</p>` : ''}
<hr><p style="font-size:12px;color:#555;">${escapeHtml(footer)}</p></body></html>`;
  return { to: input.to, subject: input.subject, text, html };
}
