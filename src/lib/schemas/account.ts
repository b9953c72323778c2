/** The account page's notification settings as posted (unchecked boxes are absent, so false). */
import { z } from '../zod';
import { FAMILY_VALUES } from './design';

export const notificationsFormSchema = z.object({
	notify_on_submit: z.boolean().default(false),
	notify_on_feedback: z.boolean().default(false),
	family: z
		.array(
			z.enum(FAMILY_VALUES, { error: (i) => `Unknown family "${String(i.input).slice(0, 40)}".` })
		)
		.default([])
});
