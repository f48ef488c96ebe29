import type { MailContent } from "@/lib/mail/templates";

function escapeHtml(s: string): string {
  return s.replace(/[&<>"']/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c]!);
}

/** The e-mail to a report's author after review: approved (with the hash) or returned (with the comment). */
export function reviewMail(p: {
  authorName: string;
  reviewerName: string;
  title: string;
  outcome: "approved" | "returned";
  comment: string | null;
  contentHash: string | null;
  link: string;
}): MailContent {
  const subject = `Tautline: "${p.title}" was ${p.outcome}`;
  const lines = [
    `Hello ${p.authorName},`,
    p.outcome === "approved"
      ? `${p.reviewerName} approved your design check "${p.title}". The scenario revision and its runs are now frozen.`
      : `${p.reviewerName} returned your design check "${p.title}" with comments.`,
    ...(p.comment ? [`Comment: ${p.comment}`] : []),
    ...(p.contentHash ? [`Content hash (sha256): ${p.contentHash}`] : []),
    `Open it: ${p.link}`,
    "Results support, and never replace, review by a qualified engineer.",
  ];
  return {
    subject,
    text: lines.join("\n\n"),
    html: `<!doctype html><html><body style="font-family:Helvetica,Arial,sans-serif;color:#10202e">${lines
      .map((l) => `<p>${escapeHtml(l)}</p>`)
      .join("")}</body></html>`,
  };
}

/** The e-mail to each reviewer when a report is submitted: a link straight to the report, and to the queue. */
export function submittedMail(p: { reviewerName: string; authorName: string; title: string; scenarioName: string; link: string; queueLink: string }): MailContent {
  const lines = [
    `Hello ${p.reviewerName},`,
    `${p.authorName} submitted the design check "${p.title}"${p.scenarioName ? ` (scenario ${p.scenarioName})` : ""} for review.`,
    `Open the report: ${p.link}`,
    `Reports awaiting review: ${p.queueLink}`,
    "Results support, and never replace, review by a qualified engineer.",
  ];
  return {
    subject: `Tautline: "${p.title}" awaits your review`,
    text: lines.join("\n\n"),
    html: `<!doctype html><html><body style="font-family:Helvetica,Arial,sans-serif;color:#10202e">${lines
      .map((l) => `<p>${escapeHtml(l)}</p>`)
      .join("")}</body></html>`,
  };
}
