// Demo accounts: one invented review board of an invented institute, and one account per
// role. Idempotent: rows that exist are reused, never overwritten. Loaded only by the demo
// seed (db/seed/index.ts), which refuses to run outside VISVIVA_MODE=demo.
// No "server-only" imports here: the seed runs under plain tsx, outside Next.js.
import { hash } from "@node-rs/argon2";
import { and, eq, sql } from "drizzle-orm";
import type { Database } from "@/db/client";
import { boardMembers, boards, users, type BoardRole } from "@/db/schema";

export const DEMO_BOARD = {
  slug: "kestrel-small-missions",
  name: "Kestrel Small Missions Board",
  description:
    "The Halden Institute of Space Technology's review board for small-satellite and rideshare mission proposals (an invented organisation for the VisViva demo).",
} as const;

export interface DemoAccount {
  key: "admin" | "chair" | "reviewer" | "proposer";
  email: string;
  password: string;
  name: string;
  organisation: string;
  isAdmin: boolean;
  /** Role on the demo board; the site admin holds none (admins may act as chair on any board). */
  role: BoardRole | null;
}

// Listed in README.md ("Demo accounts"); keep the two in step.
export const DEMO_ACCOUNTS: readonly DemoAccount[] = [
  {
    key: "admin",
    email: "admin@halden.example.org",
    password: "halden-admin-demo",
    name: "Oskar Vennberg",
    organisation: "Halden Institute of Space Technology",
    isAdmin: true,
    role: null,
  },
  {
    key: "chair",
    email: "chair@halden.example.org",
    password: "kestrel-chair-demo",
    name: "Ilona Brask",
    organisation: "Halden Institute of Space Technology",
    isAdmin: false,
    role: "chair",
  },
  {
    key: "reviewer",
    email: "reviewer@halden.example.org",
    password: "kestrel-review-demo",
    name: "Teodor Amsel",
    organisation: "Halden Institute of Space Technology",
    isAdmin: false,
    role: "reviewer",
  },
  {
    key: "proposer",
    email: "proposer@corvid-orbital.example.com",
    password: "kestrel-propose-demo",
    name: "Nadia Ferrow",
    organisation: "Corvid Orbital Works",
    isAdmin: false,
    role: "proposer",
  },
];

// Same cost as lib/auth/passwords.ts (argon2id, 19 MiB, 2 iterations, 1 lane).
const argonOptions = { memoryCost: 19_456, timeCost: 2, parallelism: 1 };

export interface SeededAccounts {
  boardId: string;
  users: Record<DemoAccount["key"], { id: string; email: string }>;
}

/** The board a seed writes into: the documented demo board, or another one (tests use a fresh slug). */
export interface SeedBoard {
  slug: string;
  name: string;
  description: string;
}

export interface SeedPerson {
  email: string;
  password: string;
  name: string;
  organisation: string;
  isAdmin: boolean;
  role: BoardRole | null;
}

/** Creates the board when it is missing and returns its id (an existing board is never changed). */
export async function ensureBoard(db: Database, board: SeedBoard = DEMO_BOARD): Promise<string> {
  await db
    .insert(boards)
    .values({ ...board })
    .onConflictDoNothing();
  const [row] = await db.select({ id: boards.id }).from(boards).where(eq(boards.slug, board.slug));
  if (!row) throw new Error(`the board ${board.slug} could not be created`);
  return row.id;
}

/** Creates the person (reused when the address exists) and their membership of the board. */
export async function ensurePerson(db: Database, boardId: string, person: SeedPerson): Promise<{ id: string; email: string }> {
  let [user] = await db
    .select({ id: users.id, email: users.email })
    .from(users)
    .where(sql`lower(${users.email}) = ${person.email}`);
  if (!user) {
    const passwordHash = await hash(person.password, argonOptions);
    await db
      .insert(users)
      .values({ email: person.email, name: person.name, organisation: person.organisation, passwordHash, isAdmin: person.isAdmin })
      .onConflictDoNothing();
    [user] = await db
      .select({ id: users.id, email: users.email })
      .from(users)
      .where(sql`lower(${users.email}) = ${person.email}`);
  }
  if (!user) throw new Error(`the demo account ${person.email} could not be created`);
  if (person.role) {
    await db.insert(boardMembers).values({ boardId, userId: user.id, role: person.role }).onConflictDoNothing();
    const [membership] = await db
      .select({ role: boardMembers.role })
      .from(boardMembers)
      .where(and(eq(boardMembers.boardId, boardId), eq(boardMembers.userId, user.id)));
    if (!membership) throw new Error(`the demo membership of ${person.email} could not be created`);
  }
  return user;
}

export async function seedDemoAccounts(db: Database, board: SeedBoard = DEMO_BOARD): Promise<SeededAccounts> {
  const boardId = await ensureBoard(db, board);
  const seeded = {} as SeededAccounts["users"];
  for (const account of DEMO_ACCOUNTS) seeded[account.key] = await ensurePerson(db, boardId, account);
  return { boardId, users: seeded };
}
