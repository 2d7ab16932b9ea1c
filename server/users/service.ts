// User accounts: used by the web admin pages, the CLI's `users` commands and sign-in.
import { and, eq } from "drizzle-orm";
import type { UserRole } from "../../shared/domain";
import type { CurrentUser } from "../../shared/schemas/auth";
import type { NewUser, UpdateUser, UserRow } from "../../shared/schemas/users";
import type { Db } from "../db/client";
import { instructors, users } from "../db/schema";
import { hashPassword } from "../auth/passwords";
import { AppError, conflict, notFound } from "../errors";

const currentUserColumns = {
  id: users.id,
  email: users.email,
  displayName: users.displayName,
  role: users.role,
  instructorId: users.instructorId,
  siteId: instructors.siteId,
  lengthUnit: users.lengthUnit,
};

export function findActiveUser(db: Db, id: number): CurrentUser | undefined {
  return db
    .select(currentUserColumns)
    .from(users)
    .leftJoin(instructors, eq(users.instructorId, instructors.id))
    .where(and(eq(users.id, id), eq(users.active, true)))
    .get();
}

export function findUserForSignIn(db: Db, email: string) {
  return db
    .select({ id: users.id, passwordHash: users.passwordHash, active: users.active })
    .from(users)
    .where(eq(users.email, email.trim().toLowerCase()))
    .get();
}

export function listUsers(db: Db): UserRow[] {
  return db
    .select({
      id: users.id,
      email: users.email,
      displayName: users.displayName,
      role: users.role,
      instructorId: users.instructorId,
      instructorCode: instructors.code,
      active: users.active,
      createdAt: users.createdAt,
    })
    .from(users)
    .leftJoin(instructors, eq(users.instructorId, instructors.id))
    .orderBy(users.email)
    .all();
}

function userRow(db: Db, id: number): UserRow {
  const row = listUsers(db).find((u) => u.id === id);
  if (!row) throw notFound("The user");
  return row;
}

function assertInstructorExists(db: Db, instructorId: number | null | undefined) {
  if (instructorId == null) return;
  const found = db.select({ id: instructors.id }).from(instructors).where(eq(instructors.id, instructorId)).get();
  if (!found) throw new AppError("invalid", 422, "That instructor does not exist.", [{ path: "instructorId", message: "Choose an existing instructor" }]);
}

export async function createUser(db: Db, input: NewUser): Promise<UserRow> {
  if (findUserForSignIn(db, input.email)) {
    throw conflict(`A user with the e-mail ${input.email} already exists.`, [{ path: "email", message: "Already in use" }]);
  }
  assertInstructorExists(db, input.instructorId);
  const passwordHash = await hashPassword(input.password);
  const created = db
    .insert(users)
    .values({
      email: input.email,
      displayName: input.displayName,
      role: input.role,
      instructorId: input.role === "instructor" ? input.instructorId : null,
      passwordHash,
    })
    .returning({ id: users.id })
    .get();
  return userRow(db, created.id);
}

export function updateUser(db: Db, id: number, changes: UpdateUser): UserRow {
  const existing = userRow(db, id);
  assertInstructorExists(db, changes.instructorId);
  const role = changes.role ?? existing.role;
  const instructorId = changes.instructorId !== undefined ? changes.instructorId : existing.instructorId;
  if (role === "instructor" && instructorId === null) {
    throw new AppError("invalid", 422, "An instructor account must be linked to an instructor.", [
      { path: "instructorId", message: "Choose the instructor this account belongs to" },
    ]);
  }
  db.update(users)
    .set({ ...changes, instructorId: role === "instructor" ? instructorId : null })
    .where(eq(users.id, id))
    .run();
  return userRow(db, id);
}

export async function setPassword(db: Db, id: number, password: string): Promise<void> {
  userRow(db, id);
  db.update(users)
    .set({ passwordHash: await hashPassword(password) })
    .where(eq(users.id, id))
    .run();
}

export function setLengthUnit(db: Db, id: number, lengthUnit: CurrentUser["lengthUnit"]): void {
  db.update(users).set({ lengthUnit }).where(eq(users.id, id)).run();
}

export function findUserByEmail(db: Db, email: string): UserRow | undefined {
  return listUsers(db).find((u) => u.email === email.trim().toLowerCase());
}

/** E-mail addresses of every active account with the role, in order: who reports and alerts go to. */
export function activeAddresses(db: Db, role: UserRole): string[] {
  return db
    .select({ email: users.email })
    .from(users)
    .where(and(eq(users.role, role), eq(users.active, true)))
    .orderBy(users.email)
    .all()
    .map((u) => u.email);
}
