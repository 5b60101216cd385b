// Knex CLI entry (npx knex --knexfile knexfile.ts …); the project's own scripts use db/knex-config.ts.
import { buildKnexConfig } from "./db/knex-config";

export default buildKnexConfig();
