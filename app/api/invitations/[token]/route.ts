import { errorToResponse, validationError } from "@/lib/errors";
import { getDb } from "@/db/knex";
import { readInput } from "@/lib/auth/read-input";
import { acceptInvitation } from "@/lib/requests/invitations";
import { AcceptInvitationSchema } from "@/lib/validation/requests";

/** Public: the invited person chooses a password with their one-time link (404 when it is used, expired or unknown). */
export async function POST(req: Request, route: { params: Promise<Record<string, string>> }): Promise<Response> {
  try {
    const { token = "" } = await route.params;
    const parsed = AcceptInvitationSchema.safeParse(await readInput(req));
    if (!parsed.success) throw validationError(parsed.error);
    const { email } = await acceptInvitation(getDb(), { token, password: parsed.data.password });
    return Response.json({ email });
  } catch (err) {
    return errorToResponse(err);
  }
}
