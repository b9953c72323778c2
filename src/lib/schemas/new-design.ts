import { z } from '../zod';
import { FAMILY_VALUES, POLARIZATION_VALUES, DESIGN_LIMITS } from './design';

/** The "new design" form: the design's identity plus the frequency its first draft starts at. */
export const newDesignSchema = z.object({
	title: z
		.string()
		.trim()
		.min(3, 'Give the design a title (3 characters or more).')
		.max(DESIGN_LIMITS.titleChars, `At most ${DESIGN_LIMITS.titleChars} characters.`),
	slug: z
		.string()
		.trim()
		.max(80, 'At most 80 characters.')
		.regex(
			/^([a-z0-9]+(-[a-z0-9]+)*)?$/,
			'Lower-case letters, digits and single hyphens, like "biquad-5g8".'
		)
		.default(''),
	family: z.enum(FAMILY_VALUES, 'Choose an antenna family.'),
	polarization: z.enum(POLARIZATION_VALUES, 'Choose a polarization.'),
	summary: z
		.string()
		.trim()
		.max(DESIGN_LIMITS.summaryChars, `At most ${DESIGN_LIMITS.summaryChars} characters.`)
		.default(''),
	frequency: z.string().trim().min(1, 'Enter the design frequency, like "2.45 GHz".').max(40)
});

/** A design file (.md with front matter) to start a draft from. */
export const importDesignSchema = z.object({
	file: z
		.instanceof(File, { error: 'Choose a design file (.md) to import.' })
		.refine((f) => f.size > 0, 'Choose a design file (.md) to import.')
});
