// What the e-mail sign-in says and its numbers (decision 023), for the server and the pages alike.
export const CODE_MINUTES = 10;
export const MAX_WRONG_CODES = 5;
export const CODE_DIGITS = 6;

export const SIGN_IN_MESSAGES = {
  sent: "If this address belongs to a Hiltbench client, a code is on its way. It works for 10 minutes.",
  badEmail: "Type an e-mail address such as name@example.com.",
  badCode: `The code is the ${CODE_DIGITS} digits from the e-mail.`,
  noCode: "There is no code waiting in this browser: ask for a code first, in the same browser.",
  wrong: (left: number) => `That code is not right. Check the e-mail and try again (${left} ${left === 1 ? "try" : "tries"} left).`,
  tooMany: "Too many wrong codes: this code no longer works. Ask for a new one.",
  expired: `This code has expired (codes last ${CODE_MINUTES} minutes). Ask for a new one.`,
  used: "This code or link was already used to sign in. Ask for a new code if you need to sign in again.",
  badLink: "This sign-in link is not one Hiltbench sent, or it was cut short. Ask for a new code.",
  otherBrowser: "Open the link in the browser where you asked for the code, or type the code there.",
  olderLink: "This link belongs to an older code: use the newest e-mail, or ask for a new code.",
} as const;

/** Where a client goes after signing in: the handoff sheet they were sent to (a release e-mail's link), else their list. */
export function clientLanding(next: unknown): string {
  return typeof next === "string" && /^\/handoff\/[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i.test(next) ? next : "/handoff";
}
