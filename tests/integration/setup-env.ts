import { loadLocalEnv } from "@/db/load-env";
import { TEST_ENV } from "./test-env";

loadLocalEnv();
Object.assign(process.env, TEST_ENV);
