// Demo data: a demo restorer, a site admin, one invented vehicle and its drawn harness
// (the circuit core's invented demo harness, 52 parts), and an invented owners' club whose
// organiser shares a checked copy of the same harness with it, so the club library, the
// "Shared" page and copying to one's garage have something to show.
// Idempotent: run it again and it finds what is there instead of adding copies.
// Every name here is invented (the maker, the model, the people).
import { and, eq } from 'drizzle-orm';
import * as accounts from '../src/lib/server/auth/accounts';
import { db } from '../src/lib/server/db';
import { clubMembers, clubs, comments, diagnoses, diagramShares, diagrams, vehicles, type Diagram, type User } from '../src/lib/server/db/schema';
import * as diagnosisStore from '../src/lib/server/diagnoses';
import { closePlanning } from '../src/lib/server/planning/pool';
import * as diagramStore from '../src/lib/server/garage/diagrams';
import { demoHarness } from '../src/lib/circuit/demo';
import { defaultScenario } from '../src/lib/circuit/scenario';
import { readingsIf } from '../src/lib/circuit/what-if';
import { OPEN_HUNT, PAST_HUNTS, type DemoHunt } from '../src/lib/diagnosis/demo';
import type { User as SessionUser } from 'lucia';

export const DEMO = { email: 'demo@loomwright.test', password: 'tracer-stripe-demo', displayName: 'Demo Restorer' };
export const ADMIN = { email: 'admin@loomwright.test', password: 'earth-strap-admin', displayName: 'Site admin' };
export const ORGANISER = { email: 'organiser@loomwright.test', password: 'bonded-earth-organiser', displayName: 'Club Organiser' };
export const CLUB = {
	name: 'Ostrimmel Tourer Register',
	description: 'Invented demo club for owners of the (equally invented) Ombrith & Vessick Ostrimmel. Checked harness diagrams are shared here; copy one to your garage and correct it for your car.'
};

async function account(input: accounts.NewAccount): Promise<User> {
	const found = await accounts.findByEmail(input.email);
	if (found) return found;
	const created = await accounts.createAccount(input);
	if (!created.ok) throw new Error(`seed: could not create ${input.email}: ${created.message}`);
	return created.user;
}

/**
 * A demo diagnosis. A past one is walked to its end as a person would: each planned probe read
 * as the planted fault makes it read, then concluded, with dates moved into the past.
 */
async function seedHunt(user: User, diagram: Diagram, hunt: DemoHunt) {
	const [found] = await db.select({ id: diagnoses.id }).from(diagnoses).where(and(eq(diagnoses.diagramId, diagram.id), eq(diagnoses.title, hunt.title)));
	if (found) return;
	const doc = demoHarness();
	const base = defaultScenario(doc);
	const scenario = { ...base, switches: { ...base.switches, ...(hunt.switches ?? {}) } };
	const who = { id: user.id } as SessionUser;
	const { diagnosis } = await diagnosisStore.start(who, diagram, { revision: diagram.revision, title: hunt.title, marks: hunt.marks, scenario, meter: 'entry-dmm' });
	if (!hunt.concluded) return;
	const started = new Date(Date.now() - hunt.concluded.daysAgo * 86_400_000);
	const [row] = await db.select().from(diagnoses).where(eq(diagnoses.id, diagnosis.id));
	for (let step = 0; step < 12; step++) {
		const loaded = await diagnosisStore.load(row);
		const next = (await diagnosisStore.planOf(loaded)).result.plan.steps[0];
		if (!next) break;
		const [reading] = readingsIf({ doc, scenario, probes: [next.probe], fault: hunt.plantedFault });
		const takenAt = new Date(started.getTime() + (step + 1) * 6 * 60_000).toISOString();
		await diagnosisStore.addReadings(who, loaded, [{ clientId: crypto.randomUUID(), probe: next.probe, outcome: 'value', value: Math.round(reading.reading * 100) / 100, unit: reading.unit, note: '', takenAt }]);
	}
	const done = await diagnosisStore.conclude(await diagnosisStore.load((await db.select().from(diagnoses).where(eq(diagnoses.id, diagnosis.id)))[0]), {
		version: row.version,
		foundSuspect: hunt.plantedSuspect,
		conclusion: hunt.concluded.conclusion,
		partsReplaced: hunt.concluded.partsReplaced
	});
	await db.update(diagnoses).set({ createdAt: started, updatedAt: started, concludedAt: new Date(started.getTime() + 3 * 3_600_000) }).where(eq(diagnoses.id, done.id));
}

/** The vehicle named `name` in `owner`'s garage, made once. */
async function vehicleOf(owner: User, name: string, values: Omit<typeof vehicles.$inferInsert, 'ownerId' | 'name'>) {
	const [found] = await db
		.select()
		.from(vehicles)
		.where(and(eq(vehicles.ownerId, owner.id), eq(vehicles.name, name)));
	return found ?? (await db.insert(vehicles).values({ ownerId: owner.id, name, ...values }).returning())[0];
}

/** The diagram titled `title` on `vehicle`, made once from `document`. */
async function diagramOf(vehicle: typeof vehicles.$inferSelect, authorId: string, title: string, document: ReturnType<typeof demoHarness>): Promise<Diagram> {
	const [found] = await db
		.select()
		.from(diagrams)
		.where(and(eq(diagrams.vehicleId, vehicle.id), eq(diagrams.title, title)));
	return found ?? (await diagramStore.create(vehicle, authorId, title, document));
}

/** The demo club: the organiser runs it, the demo restorer is a member; both share a harness with it. */
async function seedClub(organiser: User, demo: User, demoDiagram: Diagram) {
	let [club] = await db.select().from(clubs).where(eq(clubs.name, CLUB.name));
	club ??= (await db.insert(clubs).values(CLUB).returning())[0];
	await db
		.insert(clubMembers)
		.values([
			{ clubId: club.id, userId: organiser.id, role: 'organiser' },
			{ clubId: club.id, userId: demo.id, role: 'member' }
		])
		.onConflictDoNothing();
	const car = await vehicleOf(organiser, 'Register car no. 7', {
		make: 'Ombrith & Vessick',
		model: 'Ostrimmel Tourer',
		year: '1963',
		systemVoltage: 12,
		earthPolarity: 'positive',
		notes: 'Invented demo vehicle: the club organiser’s own Ostrimmel, used to check the register’s harness diagram.'
	});
	const checked = await diagramOf(car, organiser.id, 'Register harness, checked wire by wire', demoHarness());
	await db.insert(diagramShares).values({ diagramId: checked.id, clubId: club.id, level: 'view' }).onConflictDoNothing();
	await db.insert(diagramShares).values({ diagramId: demoDiagram.id, clubId: club.id, level: 'comment' }).onConflictDoNothing();
	const note = 'Checked against my own car: the colours match the register diagram. Fuses are numbered from the front of the box.';
	const [said] = await db
		.select({ id: comments.id })
		.from(comments)
		.where(and(eq(comments.diagramId, demoDiagram.id), eq(comments.body, note)));
	if (!said) await db.insert(comments).values({ diagramId: demoDiagram.id, authorId: organiser.id, target: 'diagram', body: note, createdAt: new Date(Date.now() - 5 * 86_400_000) });
}

async function main() {
	const demo = await account(DEMO);
	await account({ ...ADMIN, role: 'admin' });

	const ostrimmel = await vehicleOf(demo, 'The Ostrimmel', {
		make: 'Ombrith & Vessick',
		model: 'Ostrimmel Tourer',
		year: '1962',
		systemVoltage: 12,
		earthPolarity: 'positive',
		notes:
			'Invented demo vehicle. Dynamo charging with a two-bobbin regulator; fuel and temperature gauges fed through a voltage stabilizer behind the speedometer.\nSince the winter lay-up the fuel and temperature gauges both read low; the stabilizer is the obvious suspect.'
	});
	const diagram = await diagramOf(ostrimmel, demo.id, 'Complete harness', demoHarness());
	for (const hunt of [...PAST_HUNTS, OPEN_HUNT]) await seedHunt(demo, diagram, hunt);
	await seedClub(await account(ORGANISER), demo, diagram);

	console.log('[seed] demo account  %s / %s', DEMO.email, DEMO.password);
	console.log('[seed] site admin    %s / %s', ADMIN.email, ADMIN.password);
	console.log('[seed] club organiser %s / %s (%s)', ORGANISER.email, ORGANISER.password, CLUB.name);
}

try {
	await main();
} finally {
	await closePlanning();
	await db.$client.end();
}
