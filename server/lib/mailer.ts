import nodemailer from 'nodemailer';
import type { AppConfig } from '../config.ts';

export interface OutgoingMail {
  to: string;
  subject: string;
  text: string;
  html: string;
  /** Extra headers, e.g. List-Unsubscribe on notices (RFC 8058). */
  headers?: Record<string, string>;
}

export interface Mailer {
  send(mail: OutgoingMail): Promise<void>;
}

/**
 * SMTP through nodemailer: `SMTP_URL` when set (a real provider), else the development mail catcher
 * on loopback (`MAIL_CATCHER_PORT`), which `npm start` runs inside the server process.
 */
export function createSmtpMailer(config: AppConfig): Mailer {
  const transport = config.smtpUrl
    ? nodemailer.createTransport(config.smtpUrl)
    : nodemailer.createTransport({ host: '127.0.0.1', port: config.mailCatcherPort, secure: false, ignoreTLS: true });
  return {
    async send(mail) {
      await transport.sendMail({ from: config.mailFrom, ...mail });
    },
  };
}

export function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
}

/** The one HTML frame of every message: the product's colours, readable without images. */
export function htmlMessage(
  title: string,
  paragraphs: string[],
  link?: { href: string; label: string },
  /** A small closing line ending in a link, e.g. why the e-mail came and how to turn such e-mails off. */
  footer?: { text: string; href: string; label: string },
): string {
  const body = paragraphs.map((p) => `<p style="margin:0 0 12px">${escapeHtml(p)}</p>`).join('');
  const button = link
    ? `<p style="margin:16px 0"><a href="${escapeHtml(link.href)}" style="background:#0f5c5c;color:#ffffff;padding:10px 16px;border-radius:4px;text-decoration:none">${escapeHtml(link.label)}</a></p><p style="font-size:13px;color:#545b69">Or open this address: ${escapeHtml(link.href)}</p>`
    : '';
  const closing = footer
    ? `<p style="font-size:13px;color:#545b69;margin:24px 0 0">${escapeHtml(footer.text)} <a href="${escapeHtml(footer.href)}" style="color:#545b69">${escapeHtml(footer.label)}</a></p>`
    : '';
  return `<!doctype html><html><body style="background:#f6f4ef;color:#1d2330;font-family:'Source Sans 3',Arial,sans-serif;padding:24px"><div style="max-width:560px;margin:auto;background:#fffdf9;border:1px solid #ddd7ca;padding:24px"><p style="font-weight:700;margin:0 0 16px">Pacewright</p><h1 style="font-size:20px;margin:0 0 16px">${escapeHtml(title)}</h1>${body}${button}${closing}</div></body></html>`;
}
