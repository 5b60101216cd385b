import { z } from "zod";

export const ArchivePopulationSchema = z.object({
  archived: z.boolean({ error: "Say whether the population is archived (true or false)" }),
});
