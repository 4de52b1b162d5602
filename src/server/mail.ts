import nodemailer, { type Transporter } from 'nodemailer';
import { env } from './env';

let transporter: Transporter | undefined;

/** The one mail transport. Locally it is the SMTP catcher in fakes/; elsewhere any SMTP_URL. */
export function mailTransport(): Transporter {
  transporter ??= nodemailer.createTransport(env().SMTP_URL);
  return transporter;
}

export interface OutgoingMail {
  to: string;
  subject: string;
  text: string;
  html?: string;
}

export async function sendMail(mail: OutgoingMail): Promise<void> {
  await mailTransport().sendMail({ from: env().MAIL_FROM, ...mail });
}

/** True when the SMTP server answers a connection and greeting. */
export async function mailReachable(): Promise<boolean> {
  try {
    return await mailTransport().verify();
  } catch {
    return false;
  }
}

export function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
}
