// The message a new user receives. It never carries a password: the coordinator hands the first one over
// separately, and the user changes it after signing in.
import { roleLabels, type UserRole } from "../../shared/domain";
import type { MailReceipt, Mailer } from "./mailer";

export interface WelcomeUser {
  email: string;
  displayName: string;
  role: UserRole;
}

export function welcomeMessage(user: WelcomeUser, signInUrl: string) {
  return {
    to: [user.email],
    subject: "Your Quarterbeat account",
    text: [
      `Hello ${user.displayName},`,
      "",
      `An account has been set up for you on Quarterbeat, the training-quality hub of your CPR training network, with the role "${roleLabels[user.role]}".`,
      "",
      `Sign in at ${signInUrl} with this e-mail address (${user.email}).`,
      "Your coordinator will give you your first password separately; please change it under Account after you sign in.",
      "",
      "If you did not expect this message, you can ignore it; nobody can sign in without the password.",
    ].join("\n"),
  };
}

export function sendWelcomeEmail(mailer: Mailer, user: WelcomeUser, signInUrl: string): Promise<MailReceipt> {
  return mailer.send(welcomeMessage(user, signInUrl));
}
