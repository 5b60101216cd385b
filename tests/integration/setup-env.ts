import { loadLocalEnv } from "@/db/load-env";

loadLocalEnv();
process.env.DB_NAME = "sondage_test";
