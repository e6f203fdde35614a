// The zod schemas for every form and JSON body the server accepts. Types are inferred from them.
import { z } from 'zod';
import { PASSWORD_MAX } from './auth/password-policy';

const text = (label: string, max: number) =>
	z.string({ error: `${label} is required.` }).trim().max(max, `${label} can be at most ${max} characters.`);

const required = (label: string, max: number) => text(label, max).min(1, `${label} is required.`);

export const email = z
	.string({ error: 'E-mail address is required.' })
	.trim()
	.min(1, 'E-mail address is required.')
	.max(254, 'An e-mail address is at most 254 characters.')
	.pipe(z.email('Enter an e-mail address like name@example.org.'));

export const signUpForm = z.object({
	displayName: required('Your name', 60),
	email,
	// Length and the common-password list are checked by the password policy, with its own words;
	// no trimming, so spaces count (OWASP ASVS 4.0.3 §2.1.3: no truncation or rewriting).
	password: z.string({ error: 'Choose a password.' }).min(1, 'Choose a password.')
});

export const signInForm = z.object({
	email,
	password: z
		.string({ error: 'Enter your password.' })
		.min(1, 'Enter your password.')
		.max(PASSWORD_MAX * 4, 'That password is longer than any Loomwright accepts.')
});

const voltage = z.coerce
	.number({ error: 'Choose 6, 12 or 24 volts.' })
	.pipe(z.union([z.literal(6), z.literal(12), z.literal(24)], { error: 'Choose 6, 12 or 24 volts.' }));

const polarity = z.enum(['negative', 'positive'], { error: 'Choose negative or positive earth.' });

// The fields without defaults: PATCH must not fill in fields it was not sent.
const vehicleShape = {
	name: required('Name', 80),
	make: text('Make', 60),
	model: text('Model', 60),
	year: text('Year', 20),
	systemVoltage: voltage,
	earthPolarity: polarity,
	notes: text('Notes', 4000)
};

export const vehicleFields = z.object({
	...vehicleShape,
	make: vehicleShape.make.default(''),
	model: vehicleShape.model.default(''),
	year: vehicleShape.year.default(''),
	notes: vehicleShape.notes.default('')
});
export type VehicleInput = z.infer<typeof vehicleFields>;

/** PATCH: any subset of the fields, at least one. */
export const vehiclePatch = z
	.object(vehicleShape)
	.partial()
	.refine((v) => Object.keys(v).length > 0, { message: 'Send at least one field to change.' });

export const diagramTitle = required('Title', 120);

export const diagramCreate = z.object({
	vehicleId: z.uuid('Choose one of your vehicles.'),
	title: diagramTitle,
	document: z.unknown().optional()
});

export const diagramSave = z.object({
	revision: z.number({ error: 'Send the revision number this save edits.' }).int().positive(),
	document: z.unknown().refine((d) => d !== undefined, 'Send the document.'),
	title: diagramTitle.optional()
});

export const diagramRename = z.object({ title: diagramTitle });

/** Form data as a plain object of strings (the last value wins for repeated names). */
export function formObject(data: FormData): Record<string, string> {
	const out: Record<string, string> = {};
	for (const [key, value] of data) if (typeof value === 'string') out[key] = value;
	return out;
}
