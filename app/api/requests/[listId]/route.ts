import { z } from "zod";
import { withClientRequest } from "@/lib/auth/with-client";
import { clientListView } from "@/lib/requests/views";

/** The request list as its client contact sees it (book values only when the list shows them). */
export const GET = withClientRequest(z.object({}), async (_input, { db, list }) => clientListView(db, list));
