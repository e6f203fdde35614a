// Demo data: a demo restorer, a site admin, one invented vehicle and its drawn harness
// (the circuit core's invented demo harness, 52 parts).
// Idempotent: run it again and it finds what is there instead of adding copies.
// Every name here is invented (the maker, the model, the people).
import { and, eq } from 'drizzle-orm';
import * as accounts from '../src/lib/server/auth/accounts';
import { db } from '../src/lib/server/db';
import { diagrams, vehicles, type User } from '../src/lib/server/db/schema';
import * as diagramStore from '../src/lib/server/garage/diagrams';
import { demoHarness } from '../src/lib/circuit/demo';

export const DEMO = { email: 'demo@loomwright.test', password: 'tracer-stripe-demo', displayName: 'Demo Restorer' };
export const ADMIN = { email: 'admin@loomwright.test', password: 'earth-strap-admin', displayName: 'Site admin' };

async function account(input: accounts.NewAccount): Promise<User> {
	const found = await accounts.findByEmail(input.email);
	if (found) return found;
	const created = await accounts.createAccount(input);
	if (!created.ok) throw new Error(`seed: could not create ${input.email}: ${created.message}`);
	return created.user;
}

async function main() {
	const demo = await account(DEMO);
	await account({ ...ADMIN, role: 'admin' });

	const name = 'The Kestrel';
	let [kestrel] = await db
		.select()
		.from(vehicles)
		.where(and(eq(vehicles.ownerId, demo.id), eq(vehicles.name, name)));
	kestrel ??= (
		await db
			.insert(vehicles)
			.values({
				ownerId: demo.id,
				name,
				make: 'Hartwell & Pryce',
				model: 'Kestrel Tourer',
				year: '1962',
				systemVoltage: 12,
				earthPolarity: 'positive',
				notes:
					'Invented demo vehicle. Dynamo charging with a two-bobbin regulator; fuel and temperature gauges fed through a voltage stabilizer behind the speedometer.\nFuel gauge has read high since the tank was refitted: suspect the sender earth.'
			})
			.returning()
	)[0];

	const title = 'Complete harness';
	const [existing] = await db
		.select({ id: diagrams.id })
		.from(diagrams)
		.where(and(eq(diagrams.vehicleId, kestrel.id), eq(diagrams.title, title)));
	if (!existing) await diagramStore.create(kestrel, demo.id, title, demoHarness());

	console.log('[seed] demo account  %s / %s', DEMO.email, DEMO.password);
	console.log('[seed] site admin    %s / %s', ADMIN.email, ADMIN.password);
}

try {
	await main();
} finally {
	await db.$client.end();
}
