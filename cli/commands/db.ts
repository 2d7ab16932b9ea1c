import type { Command } from "commander";
import { context } from "../context";

export function registerDb(program: Command) {
  const db = program.command("db").description("Database upkeep");
  db.command("migrate")
    .description("Apply pending migrations to the database (also done automatically by every command)")
    .action((_options, command: Command) => {
      const { config } = context(command);
      console.log(`Database ${config.dbFile} is up to date.`);
    });
}
