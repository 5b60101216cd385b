import { z } from "zod";

const DatabaseEnv = z.object({
  DB_HOST: z.string().min(1).default("127.0.0.1"),
  DB_PORT: z.coerce.number().int().positive().default(3366),
  DB_NAME: z.string().regex(/^sondage(_[a-z0-9]+)?$/, "DB_NAME must be sondage or sondage_<suffix>"),
  DB_USER: z.string().min(1),
  DB_PASSWORD: z.string().min(1),
});

export type DatabaseSettings = z.infer<typeof DatabaseEnv>;

/** Reads and validates the database settings from the environment; throws naming the bad variable. */
export function readDatabaseSettings(env: NodeJS.ProcessEnv = process.env): DatabaseSettings {
  const parsed = DatabaseEnv.safeParse(env);
  if (!parsed.success) {
    const fields = Object.keys(z.flattenError(parsed.error).fieldErrors).join(", ");
    throw new Error(`Database settings are missing or invalid: ${fields}. Run npm start once to create .env.local.`);
  }
  return parsed.data;
}
