import { z } from "zod";
import { withFirmAdmin } from "@/lib/auth/with-role";
import { listUndeliveredMailByFirmId } from "@/lib/data/mail-outbox";

/** The firm's messages not delivered yet (retrying), given up, or of unknown fate (a server died mid-send). */
export const GET = withFirmAdmin(z.object({}), async (_input, { db, user }) => ({
  messages: await listUndeliveredMailByFirmId(db, { firmId: user.firmId }),
}));
