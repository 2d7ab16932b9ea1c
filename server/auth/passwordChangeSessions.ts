// What a password change does to sessions: every other session of that user ends, so a cookie taken before
// the change stops working, and the session that made the change (when it is the user's own) gets a new id.
import type { Request, Response } from "express";
import type { CurrentUser, SessionAnswer } from "../../shared/schemas/auth";
import type { SqliteSessionStore } from "./sessionStore";

export function logIn(req: Request, user: CurrentUser): Promise<void> {
  // passport 0.7 regenerates the session id on login, which defeats session fixation
  return new Promise((resolve, reject) => req.logIn(user, (err) => (err ? reject(err) : resolve())));
}

/**
 * Ends the sessions of `userId` after their password changed. Answers the new session (with its CSRF token,
 * which is bound to the session id) when the request was the user's own, otherwise null.
 */
export type EndSessionsAfterPasswordChange = (req: Request, res: Response, userId: number) => Promise<SessionAnswer | null>;

export function endSessionsAfterPasswordChange(store: SqliteSessionStore, csrfToken: (req: Request, res: Response) => string): EndSessionsAfterPasswordChange {
  return async (req, res, userId) => {
    const own = req.user?.id === userId ? req.user : undefined;
    await store.endSessionsOfUser(userId, own ? req.session.id : undefined);
    if (!own) return null;
    await logIn(req, own);
    return { user: own, csrfToken: csrfToken(req, res) };
  };
}
