// Sends Sheaf's e-mail through nodemailer (SMTP; the local catcher in development and tests).
import nodemailer from 'nodemailer';
import { BRAND, PRINT } from '../../shared/brand/colours';

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

/**
 * The mail's colours: every one is a brand token from shared/brand/colours.ts (the printed
 * packet's palette), so mail, print and the web app keep one green.
 */
const MAIL = {
  paper: PRINT.paper,
  ground: PRINT.headerGround,
  ink: PRINT.ink,
  muted: PRINT.muted,
  line: PRINT.line,
  wordmark: BRAND,
  rule: PRINT.rule,
  button: PRINT.button,
  onButton: PRINT.onButton,
} as const;

const FONT = "font-family: 'Inter', 'Segoe UI', Helvetica, Arial, sans-serif;";

/**
 * Builds the text and HTML parts of a plain Sheaf e-mail with one call-to-action link: the
 * wordmark over a straw rule, the paragraphs, a green button with its address written out
 * below it (for mail readers that hide buttons), and a muted footer. Tables and inline styles
 * only, as mail readers ignore style sheets.
 */
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
  const paragraphs = input.paragraphs
    .map((p) => `<p style="margin: 0 0 16px; line-height: 1.5;">${escapeHtml(p)}</p>`)
    .join('\n');
  const link = input.link
    ? `<p style="margin: 24px 0 8px;"><a href="${escapeHtml(input.link.url)}" style="display: inline-block; background: ${MAIL.button}; color: ${MAIL.onButton}; padding: 12px 20px; border-radius: 6px; font-weight: 600; text-decoration: none;">${escapeHtml(input.link.label)}</a></p>
<p style="margin: 0 0 16px; font-size: 13px; color: ${MAIL.muted}; word-break: break-all;">${escapeHtml(input.link.url)}</p>`
    : '';
  const html = `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width"><title>${escapeHtml(input.subject)}</title></head>
<body style="margin: 0; padding: 0; background: ${MAIL.ground};">
<table role="presentation" width="100%" cellpadding="0" cellspacing="0" style="background: ${MAIL.ground};"><tr><td style="padding: 24px 12px;">
<table role="presentation" width="100%" cellpadding="0" cellspacing="0" style="max-width: 560px; margin: 0 auto; background: ${MAIL.paper}; border: 1px solid ${MAIL.line}; border-radius: 8px;">
<tr><td style="padding: 20px 24px 12px; border-bottom: 3px solid ${MAIL.rule}; ${FONT} font-size: 22px; font-weight: 700; letter-spacing: 0.02em; color: ${MAIL.wordmark};">Sheaf</td></tr>
<tr><td style="padding: 20px 24px 8px; ${FONT} font-size: 16px; color: ${MAIL.ink};">
${paragraphs}
${link}
</td></tr>
<tr><td style="padding: 12px 24px 20px; border-top: 1px solid ${MAIL.line}; ${FONT} font-size: 12px; line-height: 1.5; color: ${MAIL.muted};">${escapeHtml(footer)}</td></tr>
</table>
</td></tr></table>
</body></html>`;
  return { to: input.to, subject: input.subject, text, html };
}
