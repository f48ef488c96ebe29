import { ROLE_LABELS, type Role } from "@/lib/auth/roles";

export interface MailContent {
  subject: string;
  text: string;
  html: string;
}

const PRODUCT = "Tautline";

function escapeHtml(s: string): string {
  return s.replace(/[&<>"']/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c]!);
}

/** Plain, readable HTML that survives any mail client: one column, one button-like link. */
function layout(title: string, paragraphs: string[], link: { href: string; label: string } | null, footnote: string): string {
  const p = paragraphs.map((t) => `<p style="margin:0 0 14px">${escapeHtml(t)}</p>`).join("");
  return `<!doctype html><html><body style="margin:0;background:#f7f5f0;font-family:Helvetica,Arial,sans-serif;color:#10202e">
<table role="presentation" width="100%" cellpadding="0" cellspacing="0"><tr><td style="padding:24px">
<table role="presentation" width="560" cellpadding="0" cellspacing="0" style="max-width:560px;background:#ffffff;border:1px solid #e3e8ec;border-radius:8px">
<tr><td style="padding:16px 24px;background:#10202e;color:#f5c16c;font-weight:700;letter-spacing:.04em;border-radius:8px 8px 0 0">${PRODUCT}</td></tr>
<tr><td style="padding:24px;font-size:15px;line-height:1.5">
<h1 style="font-size:18px;margin:0 0 16px">${escapeHtml(title)}</h1>${p}
${link ? linkBlock(link) : ""}
<p style="margin:0;font-size:13px;color:#5f7386">${escapeHtml(footnote)}</p>
</td></tr></table></td></tr></table></body></html>`;
}

function linkBlock(link: { href: string; label: string }): string {
  return `<p style="margin:20px 0"><a href="${escapeHtml(link.href)}" style="display:inline-block;background:#e08a00;color:#0b1620;padding:10px 18px;border-radius:6px;text-decoration:none;font-weight:700">${escapeHtml(link.label)}</a></p>
<p style="margin:0 0 14px;font-size:13px;color:#5f7386">If the button does not work, paste this link into your browser:<br><a href="${escapeHtml(link.href)}" style="color:#1a2f42;word-break:break-all">${escapeHtml(link.href)}</a></p>`;
}

function hours(ms: number): string {
  const h = Math.round(ms / 3_600_000);
  return h === 1 ? "1 hour" : `${h} hours`;
}

export function inviteMail(p: {
  inviteeName: string;
  inviterName: string;
  organisationName: string;
  role: Role;
  link: string;
  validForMs: number;
}): MailContent {
  const subject = `${PRODUCT}: you are invited to ${p.organisationName}`;
  const lines = [
    `Hello ${p.inviteeName},`,
    `${p.inviterName} invited you to ${p.organisationName} on ${PRODUCT} as ${ROLE_LABELS[p.role]}.`,
    `Open the link below to choose your password. It works once and expires in ${hours(p.validForMs)}.`,
  ];
  const foot = "If you did not expect this invitation, ignore this e-mail; no account is active until the link is used.";
  return {
    subject,
    text: `${lines.join("\n\n")}\n\n${p.link}\n\n${foot}\n\n— ${PRODUCT}\n`,
    html: layout(`Join ${p.organisationName} on ${PRODUCT}`, lines, { href: p.link, label: "Choose your password" }, foot),
  };
}

/** To someone who already has an account elsewhere: an invitation they cannot take, so nothing changed. */
export function inviteElsewhereMail(p: { inviterName: string; organisationName: string }): MailContent {
  const subject = `${PRODUCT}: an invitation to ${p.organisationName}`;
  const lines = [
    `${p.inviterName} of ${p.organisationName} tried to invite this e-mail address to ${PRODUCT}.`,
    `This address already has an account with another organisation, and an address belongs to one organisation, so nothing changed. To join ${p.organisationName}, ask them to invite another address, or ask your own administrator to deactivate this one first.`,
  ];
  const foot = "If you did not expect this, you can ignore this e-mail; your account is as it was.";
  return { subject, text: `${lines.join("\n\n")}\n\n${foot}\n\n— ${PRODUCT}\n`, html: layout(subject, lines, null, foot) };
}

export function resetMail(p: { name: string; link: string; validForMs: number }): MailContent {
  const subject = `${PRODUCT}: reset your password`;
  const lines = [
    `Hello ${p.name},`,
    `Someone asked to reset the password of your ${PRODUCT} account.`,
    `Open the link below to choose a new one. It works once and expires in ${hours(p.validForMs)}.`,
  ];
  const foot = "If you did not ask for this, ignore this e-mail; your password stays as it is.";
  return {
    subject,
    text: `${lines.join("\n\n")}\n\n${p.link}\n\n${foot}\n\n— ${PRODUCT}\n`,
    html: layout("Reset your password", lines, { href: p.link, label: "Choose a new password" }, foot),
  };
}

export function passwordChangedMail(p: { name: string }): MailContent {
  const lines = [
    `Hello ${p.name},`,
    `The password of your ${PRODUCT} account was just changed, and other signed-in sessions were signed out.`,
    "If this was not you, ask your organisation's administrator to reset your account at once.",
  ];
  const text = `${lines.join("\n\n")}\n\n— ${PRODUCT}\n`;
  const html = `<!doctype html><html><body style="font-family:Helvetica,Arial,sans-serif;color:#10202e">${lines
    .map((l) => `<p>${escapeHtml(l)}</p>`)
    .join("")}<p>— ${PRODUCT}</p></body></html>`;
  return { subject: `${PRODUCT}: your password was changed`, text, html };
}
