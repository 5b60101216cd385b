import type { Knex } from "knex";
import * as m0001 from "./20261202_0001_firms_users";
import * as m0002 from "./20261202_0002_engagements";
import * as m0003 from "./20261202_0003_audit_log";
import * as m0004 from "./20261202_0004_populations";
import * as m0005 from "./20261202_0005_samples";
import * as m0006 from "./20261202_0006_item_evidence";
import * as m0007 from "./20261202_0007_review";
import * as m0008 from "./20261202_0008_advisor_runs";
import * as m0009 from "./20261202_0009_client_requests";
import * as m0010 from "./20261203_0010_firm_methodology";
import * as m0011 from "./20261203_0011_auditor_conclusion";
import * as m0012 from "./20261203_0012_advisor_rationale_reason";
import * as m0013 from "./20261203_0013_nonstatistical";
import * as m0014 from "./20261203_0014_misstatements";
import * as m0015 from "./20261203_0015_scale_out";
import * as m0016 from "./20261203_0016_sessions_and_archive";

type Migration = { up(knex: Knex): Promise<void>; down(knex: Knex): Promise<void> };

/** Every migration, in order. Add a new file here too: the list is static so it bundles and runs anywhere. */
const migrations: Record<string, Migration> = {
  "20261202_0001_firms_users": m0001,
  "20261202_0002_engagements": m0002,
  "20261202_0003_audit_log": m0003,
  "20261202_0004_populations": m0004,
  "20261202_0005_samples": m0005,
  "20261202_0006_item_evidence": m0006,
  "20261202_0007_review": m0007,
  "20261202_0008_advisor_runs": m0008,
  "20261202_0009_client_requests": m0009,
  "20261203_0010_firm_methodology": m0010,
  "20261203_0011_auditor_conclusion": m0011,
  "20261203_0012_advisor_rationale_reason": m0012,
  "20261203_0013_nonstatistical": m0013,
  "20261203_0014_misstatements": m0014,
  "20261203_0015_scale_out": m0015,
  "20261203_0016_sessions_and_archive": m0016,
};

export const migrationSource: Knex.MigrationSource<string> = {
  getMigrations: () => Promise.resolve(Object.keys(migrations)),
  getMigrationName: (name) => name,
  getMigration: (name) => Promise.resolve(migrations[name]),
};
