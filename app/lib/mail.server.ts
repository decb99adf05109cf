/**
 * Outgoing e-mail through nodemailer over SMTP (SMTP_URL; a local fake in development and tests).
 * Every message has a text and an HTML part built from the same words.
 */
import nodemailer, { type Transporter } from "nodemailer";

export interface MailMessage {
  to: string;
  subject: string;
  text: string;
  html: string;
}

let transport: { url: string; transporter: Transporter } | undefined;

function transporter(): Transporter {
  const url = process.env.SMTP_URL;
  if (!url) throw new Error("SMTP_URL is not set: e-mail cannot be sent");
  if (transport?.url !== url) {
    transport?.transporter.close();
    transport = { url, transporter: nodemailer.createTransport(url) };
  }
  return transport.transporter;
}

export async function sendMail(message: MailMessage): Promise<void> {
  await transporter().sendMail({
    from: process.env.MAIL_FROM ?? "Fallwright <no-reply@fallwright.example>",
    to: message.to,
    subject: message.subject,
    text: message.text,
    html: message.html,
  });
}

function escapeHtml(s: string): string {
  return s.replace(/[&<>"']/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c]!);
}

export interface NoticeOptions {
  to: string;
  subject: string;
  heading: string;
  paragraphs: string[];
  action?: { label: string; url: string };
  /** A closing line in small print, e.g. why the reader got this message. */
  footnote?: string;
}

/** The one layout every message uses: heading, paragraphs, an optional button link, small print. */
export function noticeMessage(o: NoticeOptions): MailMessage {
  const text = [
    o.heading,
    "",
    ...o.paragraphs.flatMap((p) => [p, ""]),
    ...(o.action ? [`${o.action.label}: ${o.action.url}`, ""] : []),
    ...(o.footnote ? [o.footnote, ""] : []),
    "Fallwright",
  ].join("\n");
  const html = `<!doctype html>
<html lang="en"><body style="margin:0;padding:24px;background:#f7f2e8;color:#1f2933;font-family:Helvetica,Arial,sans-serif">
<div style="max-width:560px;margin:0 auto;background:#fffdf8;border:1px solid #c9bfa9;padding:24px">
<p style="margin:0 0 16px;font-weight:bold;letter-spacing:.02em">Fallwright</p>
<h1 style="font-size:20px;margin:0 0 16px">${escapeHtml(o.heading)}</h1>
${o.paragraphs.map((p) => `<p style="line-height:1.5;margin:0 0 12px">${escapeHtml(p)}</p>`).join("\n")}
${
  o.action
    ? `<p style="margin:20px 0"><a href="${escapeHtml(o.action.url)}" style="display:inline-block;background:#b4471f;color:#fffdf8;padding:10px 16px;text-decoration:none;border-radius:4px">${escapeHtml(o.action.label)}</a></p>
<p style="font-size:13px;color:#52606d;line-height:1.5">If the button does not work, copy this address into your browser:<br>${escapeHtml(o.action.url)}</p>`
    : ""
}
${o.footnote ? `<p style="font-size:13px;color:#52606d;line-height:1.5;margin-top:20px">${escapeHtml(o.footnote)}</p>` : ""}
</div></body></html>`;
  return { to: o.to, subject: o.subject, text, html };
}

/** Sends a generic notice (e.g. "your attempt was reviewed") in the house layout. */
export async function sendNotice(o: NoticeOptions): Promise<void> {
  await sendMail(noticeMessage(o));
}

export function invitationMessage(o: {
  to: string;
  link: string;
  inviterName: string;
  roleLabel: string;
  organisationName: string;
  className?: string | null;
  expiresDays: number;
}): MailMessage {
  const joinClass = o.className ? ` and join the class "${o.className}"` : "";
  return noticeMessage({
    to: o.to,
    subject: `You are invited to Fallwright (${o.organisationName})`,
    heading: `${o.inviterName} invited you to Fallwright`,
    paragraphs: [
      `You have been invited to ${o.organisationName} as a ${o.roleLabel.toLowerCase()}. Open the link to choose your name and password${joinClass}.`,
      `The link works once and expires in ${o.expiresDays} days.`,
    ],
    action: { label: "Accept the invitation", url: o.link },
    footnote: "If you were not expecting this, ignore this message: no account is made until the link is used.",
  });
}

export function resetMessage(o: { to: string; link: string; expiresMinutes: number }): MailMessage {
  return noticeMessage({
    to: o.to,
    subject: "Reset your Fallwright password",
    heading: "Choose a new password",
    paragraphs: [
      "Someone (we hope you) asked to reset the password of your Fallwright account. Open the link to choose a new one; every device signed in to your account will be signed out.",
      `The link works once and expires in ${o.expiresMinutes} minutes.`,
    ],
    action: { label: "Choose a new password", url: o.link },
    footnote: "If you did not ask for this, ignore this message: your password stays as it is.",
  });
}
