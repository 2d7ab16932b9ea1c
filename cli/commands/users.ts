import type { Command } from "commander";
import { z } from "zod";
import { userRoles } from "../../shared/domain";
import { newUserSchema } from "../../shared/schemas/users";
import { AppError, validationError } from "../../server/errors";
import { listInstructors } from "../../server/sites/service";
import { createUser, findUserByEmail, listUsers, updateUser } from "../../server/users/service";
import { context } from "../context";
import { UsageError } from "../errors";
import { promptHidden, readPasswordFromStdin } from "../prompt";

const addOptions = z.object({
  name: z.string().min(1),
  role: z.enum(userRoles),
  instructor: z.string().optional(),
  passwordStdin: z.boolean().optional(),
});

export function registerUsers(program: Command) {
  const users = program.command("users").description("Manage the people who can sign in");

  users
    .command("add <email>")
    .description("Add a user; the password is read from a prompt or, with --password-stdin, from standard input")
    .requiredOption("--name <name>", "display name")
    .requiredOption("--role <role>", `one of ${userRoles.join(", ")}`)
    .option("--instructor <code>", "instructor code (required for the instructor role)")
    .option("--password-stdin", "read the password from standard input")
    .action(async (email: string, raw: unknown, command: Command) => {
      const options = addOptions.parse(raw);
      const { db } = context(command);
      let instructorId: number | null = null;
      if (options.instructor) {
        const found = listInstructors(db).find((i) => i.code === options.instructor);
        if (!found)
          throw new AppError(
            "not_found",
            404,
            `No instructor with the code ${options.instructor}.`,
            undefined,
            "List instructors in the web app under Sites, or import a class log that names them.",
          );
        instructorId = found.id;
      }
      const password = options.passwordStdin ? await readPasswordFromStdin() : await promptHidden("Password for the new user: ");
      const parsed = newUserSchema.safeParse({ email, displayName: options.name, role: options.role, instructorId, password });
      if (!parsed.success) throw validationError(parsed.error, "The new user");
      const user = await createUser(db, parsed.data);
      console.log(`Added ${user.email} (${user.role}).`);
    });

  users
    .command("list")
    .description("List users")
    .option("--json", "print JSON")
    .action((options: { json?: boolean }, command: Command) => {
      const rows = listUsers(context(command).db);
      if (options.json) return console.log(JSON.stringify(rows, null, 2));
      console.table(rows.map((u) => ({ email: u.email, name: u.displayName, role: u.role, instructor: u.instructorCode ?? "", active: u.active })));
    });

  users
    .command("deactivate <email>")
    .description("Stop a user from signing in (their history is kept)")
    .action((email: string, _options: unknown, command: Command) => {
      const { db } = context(command);
      const user = findUserByEmail(db, email);
      if (!user) throw new UsageError(`No user with the e-mail ${email}.`, "Run `quarterbeat users list` to see who exists.");
      updateUser(db, user.id, { active: false });
      console.log(`Deactivated ${user.email}.`);
    });
}
