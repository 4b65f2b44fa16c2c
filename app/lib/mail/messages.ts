// The e-mails Hiltbench sends, as plain text and HTML with a link back into the app. Pure: the
// caller passes the app's address (APP_URL) and the names; nothing here reads the clock or the
// database. A new kind of message (release, later) is one more call to `composeMail`.

export type MailMessage = { kind: string; to: string; subject: string; text: string; html: string };

export type MailContent = {
  kind: string;
  to: string;
  subject: string;
  /** Short paragraphs, plain text; each becomes a <p> in the HTML. */
  paragraphs: string[];
  /** A quoted passage (a comment, a note), kept as written. */
  quote?: string;
  /** The one link back into the app, absolute. */
  action: { label: string; url: string };
  /** Why the reader gets this mail; a workshop member's reason when absent. */
  footer?: string;
};

const escapeHtml = (s: string) => s.replace(/[&<>"']/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c]!);

/** An absolute link into the app from its base address and a path. */
export function linkTo(appUrl: string, path: string): string {
  return new URL(path, appUrl.endsWith("/") ? appUrl : `${appUrl}/`).toString();
}

/** Trim a quoted passage for an e-mail: first lines only, never the whole of a long comment. */
function excerpt(s: string, max = 600): string {
  const t = s.trim();
  return t.length <= max ? t : `${t.slice(0, max).trimEnd()} …`;
}

const FOOTER = "You get this because you are a member of a Hiltbench workshop.";
/** For a workshop's client: they are not a member. */
export const CLIENT_FOOTER = "You get this because a Hiltbench workshop is building or looking after your saber.";

export function composeMail(c: MailContent): MailMessage {
  const footer = c.footer ?? FOOTER;
  const quote = c.quote !== undefined ? excerpt(c.quote) : undefined;
  const text = [
    ...c.paragraphs,
    ...(quote !== undefined ? [quote.split("\n").map((l) => `> ${l}`).join("\n")] : []),
    `${c.action.label}: ${c.action.url}`,
    `-- \n${footer}`,
  ].join("\n\n");
  const html = [
    `<!doctype html><html><body style="font-family:system-ui,sans-serif;line-height:1.5;color:#1d1b19">`,
    ...c.paragraphs.map((p) => `<p>${escapeHtml(p)}</p>`),
    ...(quote !== undefined ? [`<blockquote style="border-left:3px solid #c8642a;margin:0;padding-left:12px;white-space:pre-wrap">${escapeHtml(quote)}</blockquote>`] : []),
    `<p><a href="${escapeHtml(c.action.url)}">${escapeHtml(c.action.label)}</a></p>`,
    `<p style="color:#6b645c;font-size:12px">${escapeHtml(footer)}</p>`,
    `</body></html>`,
  ].join("\n");
  return { kind: c.kind, to: c.to, subject: c.subject, text, html };
}

type Revision = { buildName: string; revision: number };

export function reviewRequestedMail(a: Revision & { to: string; requesterName: string; note?: string | null; url: string }): MailMessage {
  return composeMail({
    kind: "review-requested",
    to: a.to,
    subject: `Review requested: ${a.buildName}, revision ${a.revision}`,
    paragraphs: [`${a.requesterName} asks you to review revision ${a.revision} of the build "${a.buildName}".`],
    quote: a.note || undefined,
    action: { label: "Open the review", url: a.url },
  });
}

export function commentMail(a: Revision & { to: string; authorName: string; where: string; body: string; url: string }): MailMessage {
  return composeMail({
    kind: "review-comment",
    to: a.to,
    subject: `New comment on ${a.buildName}, revision ${a.revision}`,
    paragraphs: [`${a.authorName} commented on ${a.where} of revision ${a.revision} of "${a.buildName}":`],
    quote: a.body,
    action: { label: "Read the comment", url: a.url },
  });
}

export type VerdictKind = "approved" | "changes-requested";

export function verdictMail(a: Revision & { to: string; reviewerName: string; verdict: VerdictKind; note?: string | null; url: string }): MailMessage {
  const said = a.verdict === "approved" ? "approved" : "asked for changes to";
  return composeMail({
    kind: "review-verdict",
    to: a.to,
    subject: `${a.verdict === "approved" ? "Approved" : "Changes requested"}: ${a.buildName}, revision ${a.revision}`,
    paragraphs: [`${a.reviewerName} ${said} revision ${a.revision} of "${a.buildName}".`],
    quote: a.note || undefined,
    action: { label: "Open the review", url: a.url },
  });
}

/** A client's one-time sign-in code and link (decision 023). */
export function signInCodeMail(a: { to: string; code: string; minutes: number; url: string }): MailMessage {
  return composeMail({
    kind: "sign-in-code",
    to: a.to,
    subject: `Your Hiltbench sign-in code: ${a.code}`,
    paragraphs: [
      `Your sign-in code is ${a.code}. Type it on the page that asked for it; it works once, for ${a.minutes} minutes.`,
      "Or open the link below in the same browser to sign in directly.",
      "If you did not ask to sign in, you can ignore this message.",
    ],
    action: { label: "Sign in to Hiltbench", url: a.url },
    footer: "You get this because someone asked to sign in to Hiltbench with this address.",
  });
}

/** To the workshop's owners and builders: a client asked for something. */
export function clientRequestMail(a: { to: string; buildName: string; clientName: string; kindLabel: string; message: string; url: string }): MailMessage {
  return composeMail({
    kind: "client-request",
    to: a.to,
    subject: `${a.clientName} asks: ${a.kindLabel.toLowerCase()} (${a.buildName})`,
    paragraphs: [`${a.clientName} sent a request about the build "${a.buildName}": ${a.kindLabel.toLowerCase()}.`],
    quote: a.message,
    action: { label: "Open the request", url: a.url },
  });
}

/** To the client: the workshop answered their request. */
export function clientRequestAnsweredMail(a: { to: string; buildName: string; kindLabel: string; statusLabel: string; reply: string; url: string }): MailMessage {
  return composeMail({
    kind: "client-request-answered",
    to: a.to,
    subject: `Your request about the ${a.buildName}: ${a.statusLabel.toLowerCase()}`,
    paragraphs: [`The workshop answered your request (${a.kindLabel.toLowerCase()}) about the "${a.buildName}". Its status is now: ${a.statusLabel}.`],
    ...(a.reply.trim() ? { quote: a.reply } : {}),
    action: { label: "Read it in Hiltbench", url: a.url },
    footer: CLIENT_FOOTER,
  });
}
