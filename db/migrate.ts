// Applies the committed SQL migrations in drizzle/ (never `push`).
import path from "node:path";
import { drizzle } from "drizzle-orm/node-postgres";
import { migrate } from "drizzle-orm/node-postgres/migrator";
import { Pool } from "pg";

export async function runMigrations(databaseUrl: string): Promise<void> {
  const pool = new Pool({ connectionString: databaseUrl, max: 1 });
  try {
    await migrate(drizzle(pool), { migrationsFolder: path.resolve(__dirname, "..", "drizzle") });
  } finally {
    await pool.end();
  }
}

if (require.main === module) {
  const url = process.env.DATABASE_URL;
  if (!url) {
    console.error("db:migrate needs DATABASE_URL");
    process.exit(1);
  }
  runMigrations(url).then(
    () => console.error("migrations applied"),
    (error) => {
      console.error("migrations failed:", error instanceof Error ? error.message : error);
      process.exit(1);
    },
  );
}
