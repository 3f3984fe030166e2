import { z } from 'zod';

/** Optional notices a user may turn off (schedule mails always come). */
export const noticePreferencesSchema = z.object({
	reminder: z.boolean(),
	digest: z.boolean()
});
