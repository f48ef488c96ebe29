import type { MailContent } from "@/lib/mail/templates";

function escapeHtml(s: string): string {
  return s.replace(/[&<>"']/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c]!);
}

/** "A trainer shared a replay session with you." */
export function sessionInviteMail(p: { title: string; trainer: string; link: string }): MailContent {
  const subject = `Replay session: ${p.title}`;
  const text = `${p.trainer} shared the replay session "${p.title}" with you in Tautline.\n\nWatch it: ${p.link}\n`;
  const html = `<!doctype html><html><body style="font-family:Helvetica,Arial,sans-serif;color:#10202e"><h1 style="font-size:18px">${escapeHtml(subject)}</h1><p>${escapeHtml(p.trainer)} shared the replay session “${escapeHtml(p.title)}” with you in Tautline.</p><p><a href="${escapeHtml(p.link)}">Watch it</a></p></body></html>`;
  return { subject, text, html };
}
