// The development mailbox pages answer 404 in production unless HB_DEV_MAILBOX=1 asks for them;
// their data (what the local SMTP sink received) comes through here so the routes stay off db().
import { db } from "../db/db.server";
import { fail } from "../web/http.server";
import { devMailboxEnabled } from "../env.server";
import { getSinkMessage, listSinkMessages } from "../repo/mail.server";
import { isUuid } from "../repo/builds.server";

export function requireDevMailbox() {
  if (!devMailboxEnabled()) fail(404, "There is no page at this address. Check the link, or go back to the builds.");
}

/** One page of the sink's messages, newest first, optionally only those to one address. */
export function mailboxPage(q: { to?: string; page: number; perPage: number }) {
  requireDevMailbox();
  return listSinkMessages(db(), q);
}

/** One message the sink received, or undefined (a malformed id is no message). */
export async function mailboxMessage(id: string) {
  requireDevMailbox();
  return isUuid(id) ? getSinkMessage(db(), id) : undefined;
}
