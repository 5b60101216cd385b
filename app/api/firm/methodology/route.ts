import { z } from "zod";
import { withFirmAdmin } from "@/lib/auth/with-role";
import { getMethodologyByFirmId, saveMethodologyForFirm } from "@/lib/data/firm-methodology";
import { MethodologySettingsSchema } from "@/lib/validation/methodology";

/** The firm's methodology settings (firm administrators only): the latest version, who saved it and when. */
export const GET = withFirmAdmin(z.object({}), async (_input, { db, user }) => {
  return { methodology: await getMethodologyByFirmId(db, { firmId: user.firmId }) };
});

/** Saves the whole settings object as the firm's next version; plans already saved keep the version stamped on them. */
export const PUT = withFirmAdmin(MethodologySettingsSchema, async (settings, { db, user }) => {
  return { methodology: await saveMethodologyForFirm(db, { firmId: user.firmId, actorId: user.id, settings }) };
});
