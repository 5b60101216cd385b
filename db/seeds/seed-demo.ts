import bcrypt from "bcryptjs";
import type { Knex } from "knex";
import { DEMO_ENGAGEMENTS, DEMO_FIRM, DEMO_PASSWORD, DEMO_USERS } from "./demo-scenario";

/** Loads the invented demo scenario into an empty database; leaves a database that has a firm alone. */
export async function seedDemo(db: Knex): Promise<"seeded" | "skipped"> {
  const existing = await db("firms").first("id");
  if (existing) return "skipped";
  const hash = await bcrypt.hash(DEMO_PASSWORD, 10);
  await db.transaction(async (trx) => {
    const [firmId] = await trx("firms").insert({ name: DEMO_FIRM.name });
    const ids = new Map<string, number>();
    for (const u of DEMO_USERS) {
      const [id] = await trx("users").insert({
        firm_id: firmId,
        email: u.email,
        name: u.name,
        grade: u.grade,
        firm_role: u.firmRole,
        password_hash: hash,
      });
      ids.set(u.key, id);
      await trx("audit_log").insert({
        actor_user_id: null,
        entity: "user",
        entity_id: String(id),
        action: "seed",
        after_json: JSON.stringify({ email: u.email, grade: u.grade }),
      });
    }
    for (const e of DEMO_ENGAGEMENTS) {
      const [engagementId] = await trx("engagements").insert({
        firm_id: firmId,
        client_name: e.clientName,
        name: e.name,
        period_end: e.periodEnd,
        currency: e.currency,
        overall_materiality: e.overallMateriality,
        performance_materiality: e.performanceMateriality,
        status: e.status,
        created_by: ids.get("manager"),
      });
      await trx("audit_log").insert({
        actor_user_id: null,
        engagement_id: engagementId,
        entity: "engagement",
        entity_id: String(engagementId),
        action: "seed",
        after_json: JSON.stringify({ clientName: e.clientName, name: e.name }),
      });
      for (const [userKey, role] of Object.entries(e.team)) {
        await trx("engagement_members").insert({ engagement_id: engagementId, user_id: ids.get(userKey), role });
      }
    }
  });
  return "seeded";
}
