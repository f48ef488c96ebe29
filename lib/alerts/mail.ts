import type { MailContent } from "@/lib/mail/templates";

function escapeHtml(s: string): string {
  return s.replace(/[&<>"']/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c]!);
}

function appUrl(): string {
  return (process.env.NEXTAUTH_URL ?? "http://localhost:3000").replace(/\/$/, "");
}

const CAUTION = "Results support, and never replace, review by a qualified engineer; local codes, the ride manufacturer's data and licensed practice govern.";

/** The alert e-mail to the lift's ride engineers. */
export function alertMail(p: { liftName: string; liftId: number; message: string; level: string }): MailContent {
  const link = `${appUrl()}/logbook?lift=${p.liftId}`;
  const label = p.level === "limit" ? "Limit reached" : p.level === "warning" ? "Warning" : "Forecast";
  const subject = `Tautline logbook · ${label}: ${p.liftName}`;
  const text = `${p.message}\n\nOpen the logbook: ${link}\n\n${CAUTION}\n`;
  const html = `<!doctype html><html><body style="font-family:Helvetica,Arial,sans-serif;color:#10202e"><h1 style="font-size:18px">${escapeHtml(subject)}</h1><p>${escapeHtml(p.message)}</p><p><a href="${escapeHtml(link)}">Open the logbook</a></p><p style="font-size:13px;color:#5f7386">${escapeHtml(CAUTION)}</p></body></html>`;
  return { subject, text, html };
}
