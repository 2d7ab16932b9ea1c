import type { Command } from "commander";
import { clearNetwork, isEmpty, seedCounts, seedDemo } from "../../server/seed/seedDemo";
import { context } from "../context";
import { UsageError } from "../errors";

export function registerDemo(program: Command) {
  const demo = program.command("demo").description("The invented demo network");
  demo
    .command("seed")
    .description("Fill an empty database with the demo network (sites, instructors, accounts and eight quarters of data)")
    .option("--force", "first delete every person, site and imported row in the database")
    .option("--today <date>", "YYYY-MM-DD: the last day of demo history (default: today)")
    .action(async (options: { force?: boolean; today?: string }, command: Command) => {
      const { db, config } = context(command);
      if (!isEmpty(db)) {
        if (!options.force) {
          throw new UsageError(
            `${config.dbFile} already holds data; the demo network is only seeded into an empty database.`,
            "Add --force to delete everything in it first (this cannot be undone), or use --db to name another file.",
          );
        }
        clearNetwork(db);
      }
      const result = await seedDemo(db, { today: options.today });
      const counts = seedCounts(db);
      console.log(
        `Seeded ${result.network.name}: ${counts.sites} sites, ${counts.instructors} instructors, ${counts.classes} classes, ${counts.attempts} attempts (${counts.streams} with compression streams).`,
      );
      console.log("Demo sign-ins (demo data only):");
      for (const account of result.accounts) console.log(`  ${account.role.padEnd(13)} ${account.email}  ${account.password}`);
    });
}
