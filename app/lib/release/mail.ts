// The e-mail a build's client gets when the build is released. Pure, through composeMail.
import { composeMail, type MailMessage } from "../mail/messages";

export function releasedMail(a: { to: string; clientName: string; buildName: string; number: number; note: string; url: string }): MailMessage {
  return composeMail({
    kind: "build-released",
    to: a.to,
    subject: `Your saber is ready: ${a.buildName}`,
    paragraphs: [
      `Hello ${a.clientName},`,
      `The workshop has released "${a.buildName}" (release ${a.number}): it was checked on the bench and its SD card bundle is ready.`,
      "The handoff page shows your controls, your presets, the charging and battery cautions, and the card's bundle to download.",
    ],
    quote: a.note || undefined,
    action: { label: "Open your handoff page", url: a.url },
  });
}
