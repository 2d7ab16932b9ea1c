// Limits on guessing passwords. Only a refused password counts (the route calls `countAsGuess`): successes,
// malformed forms and the limiters' own 429s do not, so a busy training room behind one address can still sign
// in and a locked-out attacker who keeps knocking adds nothing to the other counters. Three counters, each
// over the same window:
// - per address and account: the tight one. One person's ten typos lock out that account from that address
//   only; a colleague at the next desk (same address, other account) signs in as usual.
// - per account, from any address: an attacker cycling addresses still gets only `accountLimit` guesses at
//   one account per window. The price: during such an attack the account's owner waits out the window too.
// - per address, over all accounts: one address trying one password on many accounts (spraying) is stopped
//   at `addressLimit`, set well above what a room of people mistyping reaches.
import type { Request, RequestHandler, Response } from "express";
import rateLimit, { ipKeyGenerator } from "express-rate-limit";

export interface SignInLimit {
  windowMs: number;
  /** Failures per address and account. */
  limit: number;
  /** Failures per account over all addresses; default three times `limit`. */
  accountLimit?: number;
  /** Failures per address over all accounts; default ten times `limit`. */
  addressLimit?: number;
}

/** Which account a request tries: the typed e-mail at sign-in, the signed-in user at a password change. */
export type AccountOf = (req: Request) => string;

export const typedEmail: AccountOf = (req) => {
  const email = (req.body as { email?: unknown } | undefined)?.email;
  return typeof email === "string" ? email.trim().toLowerCase() : "";
};

/** Marks this request as a wrong password, the only kind of request the limits count. */
export function countAsGuess(res: Response): void {
  res.locals.passwordRefused = true;
}

const addressOf = (req: Request) => ipKeyGenerator(req.ip ?? "");

function limiter(name: string, windowMs: number, limit: number, key: (req: Request) => string, message: string): RequestHandler {
  return rateLimit({
    windowMs,
    limit,
    identifier: name,
    standardHeaders: "draft-8",
    legacyHeaders: false,
    skipSuccessfulRequests: true,
    requestWasSuccessful: (_req, res) => res.locals.passwordRefused !== true,
    keyGenerator: key,
    handler: (_req, res) => {
      res.status(429).json({ error: { code: "rate_limited", message } });
    },
  });
}

/** The three counters as middleware, to put in front of a route that checks a password. */
export function passwordGuessLimits(options: SignInLimit, accountOf: AccountOf): RequestHandler[] {
  const { windowMs, limit } = options;
  const wait = "Wait a few minutes, then try again.";
  return [
    limiter("address", windowMs, options.addressLimit ?? limit * 10, addressOf, `Too many sign-in attempts from here. ${wait}`),
    limiter("account", windowMs, options.accountLimit ?? limit * 3, accountOf, `Too many sign-in attempts for this account. ${wait}`),
    limiter(
      "address-account",
      windowMs,
      limit,
      (req) => `${addressOf(req)} ${accountOf(req)}`,
      `Too many sign-in attempts for this account from here. ${wait}`,
    ),
  ];
}
