// A user's choice of alert kinds (the account page): stored on the user, null until first saved, when the
// role's defaults apply. A role without receiveImportAlerts never reaches here (the route guard).
import { eq } from "drizzle-orm";
import type { AlertKind } from "../../shared/alertKinds";
import { alertKinds } from "../../shared/alertKinds";
import type { AlertChoiceAnswer } from "../../shared/schemas/alerts";
import type { CurrentUser } from "../../shared/schemas/auth";
import type { Db } from "../db/client";
import { users } from "../db/schema";
import { chosenKinds } from "./audience";

export function alertChoice(db: Db, user: CurrentUser): AlertChoiceAnswer {
  const [row] = db.select({ alertKinds: users.alertKinds }).from(users).where(eq(users.id, user.id)).all();
  const stored = row?.alertKinds ?? null;
  return { kinds: chosenKinds(user.role, stored), isDefault: stored === null };
}

export function saveAlertChoice(db: Db, user: CurrentUser, kinds: readonly AlertKind[]): AlertChoiceAnswer {
  // kept in the order of the kinds' list, so the answer does not depend on the order the boxes were ticked
  const ordered = alertKinds.filter((kind) => kinds.includes(kind));
  db.update(users).set({ alertKinds: ordered }).where(eq(users.id, user.id)).run();
  return alertChoice(db, user);
}
