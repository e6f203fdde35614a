/**
 * The demo harness the app seeds: an invented 12 V positive-earth two-door tourer of our
 * own. Every key number, label, colour choice and value here is invented for the demo
 * (colour habits follow the common trade practice noted in TRADE.md: brown battery feed,
 * white ignition, green fused ignition, purple unswitched fused, red side and tail, black
 * earth). Laid out left to right: battery and fuses, switches, instruments, lamps, earths.
 */
import { assertDocument, type DocumentInput, type HarnessDocument } from './schema';

type P = NonNullable<DocumentInput['parts']>[number];
type W = NonNullable<DocumentInput['wires']>[number];

const col = (i: number) => 60 + i * 260;
const row = (j: number) => 60 + j * 110;

function part(id: string, key: string, label: string, kind: P['kind'], x: number, y: number, location: P['location'], extra: Record<string, unknown> = {}): P {
	return { id, key, label, kind, position: { x, y }, location, ...extra } as P;
}

function wire(id: string, from: string, to: string, code: string, mm2: number, lengthM: number): W {
	const [fp, ft] = from.split('.');
	const [tp, tt] = to.split('.');
	return { id, from: { part: fp, terminal: ft }, to: { part: tp, terminal: tt }, code, size: { mm2 }, lengthM };
}

const onOff = (off: string, on: string) => ({
	terminals: ['1', '2'],
	params: { positions: [{ name: off }, { name: on, closed: [['1', '2']] }] }
});

/** The invented demo vehicle, positive earth. */
export function demoHarness(): HarnessDocument {
	const parts: P[] = [
		// Column 0: battery, starting and the battery feed.
		part('battery', '1', 'Battery 12 V', 'battery', col(0), row(0), 'engine-bay', { params: { internalResistance: 0.015 } }),
		part('strap-earth', '2', 'Battery strap earth (body)', 'earth-point', col(0), row(2), 'engine-bay', { params: { resistance: 0.002 } }),
		part('starter-relay', '3', 'Starter solenoid', 'relay', col(0), row(4), 'engine-bay', { params: { coilResistance: 4, contactResistance: 0.002 } }),
		part('starter', '4', 'Starter motor', 'motor', col(0), row(6), 'engine-bay', { params: { resistance: 0.08 } }),
		part('feed-splice', '5', 'Battery feed splice', 'splice', col(1), row(0), 'engine-bay', { terminals: ['1', '2', '3', '4'] }),
		// Column 1: fuses and ignition switch.
		part('fuse-ign', '6', 'Fuse, ignition accessories', 'fuse', col(1), row(2), 'engine-bay', { params: { rating: 35 } }),
		part('fuse-aux', '7', 'Fuse, unswitched accessories', 'fuse', col(1), row(3), 'engine-bay', { params: { rating: 35 } }),
		part('fuse-lamps', '8', 'Fuse, lamps', 'fuse', col(1), row(4), 'engine-bay', { params: { rating: 25 } }),
		part('fuse-wiper', '9', 'Fuse, wiper', 'fuse', col(1), row(5), 'dash', { params: { rating: 15 } }),
		part('ignition', '10', 'Ignition and starter switch', 'switch', col(1), row(7), 'dash', {
			terminals: ['30', '15', '75', '50'],
			params: {
				role: 'ignition',
				positions: [
					{ name: 'off' },
					{ name: 'aux', closed: [['30', '75']] },
					{ name: 'ign', closed: [['30', '15'], ['30', '75']] },
					{ name: 'start', closed: [['30', '15'], ['30', '50']] }
				],
				defaultPosition: 'ign'
			}
		}),
		part('ign-splice', '11', 'Ignition feed splice', 'splice', col(2), row(7), 'dash', { terminals: ['1', '2', '3', '4', '5'] }),
		// Column 2: ignition, charging and warning lamps.
		part('bulkhead', '12', 'Bulkhead connector', 'connector', col(2), row(3), 'dash', {
			terminals: ['A1', 'B1', 'A2', 'B2', 'A3', 'B3', 'A4', 'B4', 'A5', 'B5', 'A6', 'B6'],
			params: { pins: [['A1', 'B1'], ['A2', 'B2'], ['A3', 'B3'], ['A4', 'B4'], ['A5', 'B5'], ['A6', 'B6']] }
		}),
		part('coil', '13', 'Ignition coil', 'ignition-coil', col(3), row(0), 'engine-bay'),
		part('points', '14', 'Contact breaker points', 'switch', col(3), row(1), 'engine-bay', {
			terminals: ['1', '2'],
			params: { positions: [{ name: 'closed', closed: [['1', '2']] }, { name: 'open' }] }
		}),
		part('generator', '15', 'Generator', 'generator', col(3), row(8), 'engine-bay'),
		part('charge-lamp', '16', 'Charging warning lamp', 'lamp', col(2), row(8), 'dash', { params: { watts: 2.2 } }),
		part('oil-lamp', '17', 'Oil pressure warning lamp', 'lamp', col(2), row(9), 'dash', { params: { watts: 2.2 } }),
		part('oil-switch', '18', 'Oil pressure switch', 'switch', col(3), row(9), 'engine-bay', {
			terminals: ['1', '2'],
			params: { positions: [{ name: 'no pressure', closed: [['1', '2']] }, { name: 'pressure' }] }
		}),
		// Column 3–4: stabilized instruments.
		part('stabilizer', '19', 'Instrument voltage stabilizer', 'stabilizer', col(3), row(3), 'dash'),
		part('fuel-gauge', '20', 'Fuel gauge', 'gauge', col(4), row(2), 'dash'),
		part('temp-gauge', '21', 'Coolant temperature gauge', 'gauge', col(4), row(4), 'dash'),
		part('fuel-sender', '22', 'Fuel tank sender', 'sender', col(5), row(2), 'fuel-tank', { params: { ohmsAt0: 145, ohmsAt1: 21, taper: 'linear', position: 0.6 } }),
		part('temp-sender', '23', 'Coolant temperature sender', 'sender', col(5), row(4), 'engine-bay', { params: { ohmsAt0: 150, ohmsAt1: 24, taper: 'logarithmic', position: 0.4 } }),
		// Lighting.
		part('light-switch', '24', 'Lighting switch', 'switch', col(2), row(11), 'dash', {
			terminals: ['in', 'side', 'head'],
			params: {
				role: 'lighting',
				positions: [
					{ name: 'off' },
					{ name: 'side', closed: [['in', 'side']] },
					{ name: 'head', closed: [['in', 'side'], ['in', 'head']] }
				]
			}
		}),
		part('dip-switch', '25', 'Dip switch', 'switch', col(3), row(12), 'cabin', {
			terminals: ['in', 'main', 'dip'],
			params: { positions: [{ name: 'dip', closed: [['in', 'dip']] }, { name: 'main', closed: [['in', 'main']] }] }
		}),
		part('side-splice', '26', 'Side and tail splice', 'splice', col(3), row(11), 'dash', { terminals: ['1', '2', '3', '4', '5', '6'] }),
		part('side-left', '27', 'Side lamp, left', 'lamp', col(5), row(10), 'front', { params: { watts: 5 } }),
		part('side-right', '28', 'Side lamp, right', 'lamp', col(5), row(11), 'front', { params: { watts: 5 } }),
		part('tail-left', '29', 'Tail lamp, left', 'lamp', col(6), row(10), 'rear', { params: { watts: 6 } }),
		part('tail-right', '30', 'Tail lamp, right', 'lamp', col(6), row(11), 'rear', { params: { watts: 6 } }),
		part('plate-lamp', '31', 'Number plate lamp', 'lamp', col(6), row(12), 'rear', { params: { watts: 5 } }),
		part('panel-lamp-1', '32', 'Panel lamp, left', 'lamp', col(4), row(6), 'dash', { params: { watts: 2.2 } }),
		part('panel-lamp-2', '33', 'Panel lamp, right', 'lamp', col(4), row(7), 'dash', { params: { watts: 2.2 } }),
		part('head-main-left', '34', 'Headlamp main beam, left', 'lamp', col(5), row(13), 'front', { params: { watts: 50 } }),
		part('head-main-right', '35', 'Headlamp main beam, right', 'lamp', col(5), row(14), 'front', { params: { watts: 50 } }),
		part('head-dip-left', '36', 'Headlamp dip beam, left', 'lamp', col(5), row(15), 'front', { params: { watts: 40 } }),
		part('head-dip-right', '37', 'Headlamp dip beam, right', 'lamp', col(5), row(16), 'front', { params: { watts: 40 } }),
		part('main-warning', '38', 'Main beam warning lamp', 'lamp', col(4), row(13), 'dash', { params: { watts: 2.2 } }),
		// Horn, wiper, brake lamps.
		part('horn-relay', '39', 'Horn relay', 'relay', col(2), row(5), 'engine-bay'),
		part('horn-push', '40', 'Horn push', 'switch', col(3), row(6), 'cabin', onOff('released', 'pressed')),
		part('horn', '41', 'Horn', 'load', col(4), row(5), 'front', { terminals: ['feed', 'earth'], params: { resistance: 3 } }),
		part('wiper-switch', '42', 'Wiper switch', 'switch', col(2), row(6), 'dash', onOff('off', 'on')),
		part('wiper', '43', 'Wiper motor', 'motor', col(4), row(8), 'engine-bay', { params: { resistance: 4 } }),
		part('brake-switch', '44', 'Brake lamp switch', 'switch', col(4), row(9), 'chassis', onOff('released', 'pressed')),
		part('rear-plug', '45', 'Rear harness connector', 'connector', col(5), row(9), 'boot', {
			terminals: ['A1', 'B1', 'A2', 'B2', 'A3', 'B3'],
			params: { pins: [['A1', 'B1'], ['A2', 'B2'], ['A3', 'B3']] }
		}),
		part('brake-left', '46', 'Brake lamp, left', 'lamp', col(6), row(8), 'rear', { params: { watts: 21 } }),
		part('brake-right', '47', 'Brake lamp, right', 'lamp', col(6), row(9), 'rear', { params: { watts: 21 } }),
		// Earth points.
		part('front-earth', '48', 'Front lamp earth', 'earth-point', col(7), row(13), 'front'),
		part('dash-earth', '49', 'Dash earth', 'earth-point', col(7), row(5), 'dash'),
		part('tank-earth', '50', 'Tank sender earth', 'earth-point', col(7), row(2), 'fuel-tank'),
		part('engine-earth', '51', 'Engine earth strap', 'earth-point', col(7), row(0), 'engine-bay', { params: { resistance: 0.003 } }),
		part('rear-earth', '52', 'Rear lamp earth', 'earth-point', col(7), row(10), 'rear')
	];

	const wires: W[] = [
		// Battery and starting. Positive earth: the + post goes to the body.
		wire('w-strap', 'battery.+', 'strap-earth.stud', 'B', 25, 0.5),
		wire('w-engine-strap', 'strap-earth.stud', 'engine-earth.stud', 'B', 25, 0.6),
		wire('w-starter-cable', 'battery.-', 'starter-relay.30', 'N', 25, 0.8),
		wire('w-starter', 'starter-relay.87', 'starter.feed', 'N', 25, 0.4),
		wire('w-starter-earth', 'starter.earth', 'engine-earth.stud', 'B', 25, 0.3),
		wire('w-solenoid', 'ignition.50', 'starter-relay.86', 'W/R', 1, 2.2),
		wire('w-solenoid-earth', 'starter-relay.85', 'engine-earth.stud', 'B', 1, 0.3),
		wire('w-battery-feed', 'starter-relay.30', 'feed-splice.1', 'N', 4, 0.6),
		// Fuses and the ignition switch.
		wire('w-feed-ign', 'feed-splice.2', 'ignition.30', 'N', 2.5, 1.8),
		wire('w-feed-aux', 'feed-splice.3', 'fuse-aux.in', 'N', 2.5, 0.3),
		wire('w-feed-lamps', 'feed-splice.4', 'fuse-lamps.in', 'N', 2.5, 0.3),
		wire('w-ign', 'ignition.15', 'ign-splice.1', 'W', 1.5, 0.3),
		wire('w-aux', 'ignition.75', 'fuse-wiper.in', 'W/G', 1, 0.3),
		wire('w-ign-fuse', 'ign-splice.2', 'fuse-ign.in', 'W', 1.5, 1.6),
		wire('w-coil-a', 'ign-splice.3', 'bulkhead.A1', 'W', 1, 0.4),
		wire('w-coil-b', 'bulkhead.B1', 'coil.15', 'W', 1, 0.9),
		wire('w-points', 'coil.1', 'points.1', 'W/B', 1, 0.5),
		wire('w-points-earth', 'points.2', 'engine-earth.stud', 'B', 1, 0.3),
		// Charging and oil warning lamps.
		wire('w-charge-lamp', 'ign-splice.4', 'charge-lamp.feed', 'W', 0.75, 0.2),
		wire('w-generator', 'charge-lamp.earth', 'generator.D', 'Y', 1, 2.4),
		wire('w-generator-earth', 'generator.E', 'engine-earth.stud', 'B', 2.5, 0.4),
		wire('w-oil-lamp', 'ign-splice.5', 'oil-lamp.feed', 'W', 0.75, 0.2),
		wire('w-oil-switch', 'oil-lamp.earth', 'oil-switch.1', 'W/N', 0.75, 2.2),
		wire('w-oil-earth', 'oil-switch.2', 'engine-earth.stud', 'B', 0.75, 0.2),
		// Stabilized instruments.
		wire('w-stab-in', 'fuse-ign.out', 'stabilizer.in', 'G', 1, 1.4),
		wire('w-stab-earth', 'stabilizer.earth', 'dash-earth.stud', 'B', 0.75, 0.3),
		wire('w-fuel-gauge', 'stabilizer.out', 'fuel-gauge.feed', 'LG', 0.75, 0.3),
		wire('w-temp-gauge', 'stabilizer.out', 'temp-gauge.feed', 'LG', 0.75, 0.3),
		wire('w-fuel-a', 'fuel-gauge.sender', 'rear-plug.A3', 'G/B', 0.75, 3.8),
		wire('w-fuel-b', 'rear-plug.B3', 'fuel-sender.feed', 'G/B', 0.75, 0.8),
		wire('w-fuel-earth', 'fuel-sender.earth', 'tank-earth.stud', 'B', 0.75, 0.2),
		wire('w-temp-a', 'temp-gauge.sender', 'bulkhead.A2', 'G/U', 0.75, 0.4),
		wire('w-temp-b', 'bulkhead.B2', 'temp-sender.feed', 'G/U', 0.75, 1.1),
		wire('w-temp-earth', 'temp-sender.earth', 'engine-earth.stud', 'B', 0.75, 0.2),
		// Lighting.
		wire('w-lamps', 'fuse-lamps.out', 'light-switch.in', 'N/U', 2, 1.8),
		wire('w-side', 'light-switch.side', 'side-splice.1', 'R', 1.5, 0.4),
		wire('w-side-front', 'side-splice.2', 'bulkhead.A6', 'R', 1, 0.5),
		wire('w-side-left', 'bulkhead.B6', 'side-left.feed', 'R', 0.75, 1.6),
		wire('w-side-right', 'bulkhead.B6', 'side-right.feed', 'R', 0.75, 2.1),
		wire('w-tail-a', 'side-splice.3', 'rear-plug.A1', 'R', 1, 3.9),
		wire('w-tail-left', 'rear-plug.B1', 'tail-left.feed', 'R', 0.75, 0.6),
		wire('w-tail-right', 'rear-plug.B1', 'tail-right.feed', 'R', 0.75, 1.2),
		wire('w-plate', 'rear-plug.B1', 'plate-lamp.feed', 'R', 0.75, 0.9),
		wire('w-panel-1', 'side-splice.4', 'panel-lamp-1.feed', 'R/W', 0.5, 0.4),
		wire('w-panel-2', 'side-splice.5', 'panel-lamp-2.feed', 'R/W', 0.5, 0.5),
		wire('w-head', 'light-switch.head', 'dip-switch.in', 'U', 1.5, 1.2),
		wire('w-main-a', 'dip-switch.main', 'bulkhead.A4', 'U/W', 1.5, 0.9),
		wire('w-main-left', 'bulkhead.B4', 'head-main-left.feed', 'U/W', 1, 1.5),
		wire('w-main-right', 'bulkhead.B4', 'head-main-right.feed', 'U/W', 1, 2.0),
		wire('w-main-warning', 'dip-switch.main', 'main-warning.feed', 'U/W', 0.5, 1.1),
		wire('w-dip-a', 'dip-switch.dip', 'bulkhead.A5', 'U/R', 1.5, 0.9),
		wire('w-dip-left', 'bulkhead.B5', 'head-dip-left.feed', 'U/R', 1, 1.5),
		wire('w-dip-right', 'bulkhead.B5', 'head-dip-right.feed', 'U/R', 1, 2.0),
		// Horn, wiper and brake lamps.
		wire('w-horn-feed', 'fuse-aux.out', 'bulkhead.A3', 'P', 1.5, 0.4),
		wire('w-horn-relay', 'bulkhead.B3', 'horn-relay.30', 'P', 1.5, 0.3),
		wire('w-horn-coil', 'bulkhead.B3', 'horn-relay.86', 'P', 0.75, 0.3),
		wire('w-horn-push', 'horn-relay.85', 'horn-push.1', 'P/B', 0.75, 2.0),
		wire('w-horn-push-earth', 'horn-push.2', 'dash-earth.stud', 'B', 0.75, 0.6),
		wire('w-horn', 'horn-relay.87', 'horn.feed', 'P', 1.5, 0.8),
		wire('w-horn-earth', 'horn.earth', 'front-earth.stud', 'B', 1.5, 0.4),
		wire('w-wiper-switch', 'fuse-wiper.out', 'wiper-switch.1', 'G/N', 1, 0.4),
		wire('w-wiper', 'wiper-switch.2', 'wiper.feed', 'G/N', 1, 1.2),
		wire('w-wiper-earth', 'wiper.earth', 'dash-earth.stud', 'B', 1, 0.4),
		wire('w-brake-switch', 'fuse-ign.out', 'brake-switch.1', 'G', 1, 1.2),
		wire('w-brake-a', 'brake-switch.2', 'rear-plug.A2', 'G/P', 1, 3.0),
		wire('w-brake-left', 'rear-plug.B2', 'brake-left.feed', 'G/P', 0.75, 0.6),
		wire('w-brake-right', 'rear-plug.B2', 'brake-right.feed', 'G/P', 0.75, 1.2),
		// Lamp earths.
		wire('w-e-side-left', 'side-left.earth', 'front-earth.stud', 'B', 0.75, 0.3),
		wire('w-e-side-right', 'side-right.earth', 'front-earth.stud', 'B', 0.75, 1.0),
		wire('w-e-main-left', 'head-main-left.earth', 'front-earth.stud', 'B', 1, 0.3),
		wire('w-e-main-right', 'head-main-right.earth', 'front-earth.stud', 'B', 1, 1.0),
		wire('w-e-dip-left', 'head-dip-left.earth', 'front-earth.stud', 'B', 1, 0.3),
		wire('w-e-dip-right', 'head-dip-right.earth', 'front-earth.stud', 'B', 1, 1.0),
		wire('w-e-tail-left', 'tail-left.earth', 'rear-earth.stud', 'B', 0.75, 0.3),
		wire('w-e-tail-right', 'tail-right.earth', 'rear-earth.stud', 'B', 0.75, 0.9),
		wire('w-e-plate', 'plate-lamp.earth', 'rear-earth.stud', 'B', 0.75, 0.5),
		wire('w-e-brake-left', 'brake-left.earth', 'rear-earth.stud', 'B', 0.75, 0.3),
		wire('w-e-brake-right', 'brake-right.earth', 'rear-earth.stud', 'B', 0.75, 0.9),
		wire('w-e-panel-1', 'panel-lamp-1.earth', 'dash-earth.stud', 'B', 0.5, 0.4),
		wire('w-e-panel-2', 'panel-lamp-2.earth', 'dash-earth.stud', 'B', 0.5, 0.5),
		wire('w-e-main-warning', 'main-warning.earth', 'dash-earth.stud', 'B', 0.5, 0.4)
	];

	return assertDocument({
		schemaVersion: 1,
		vehicle: { systemVoltage: 12, earth: 'positive' },
		palette: 'trade-letters',
		parts,
		wires,
		meta: {
			title: 'Demo: invented 12 V positive-earth tourer',
			notes:
				'An invented vehicle for trying Loomwright: every part, key number and value is made up. ' +
				'Electrical work can hurt: follow your own vehicle manual and get qualified help where unsure.'
		}
	});
}

/**
 * The same harness on the other earth polarity: the battery's two posts swap their wires.
 * (A real conversion also concerns the generator, coil and polarity-sensitive parts; this is
 * the circuit-model view, used to check that voltages mirror.)
 */
export function withOppositeEarth(doc: HarnessDocument): HarnessDocument {
	const batteries = new Set(doc.parts.filter((p) => p.kind === 'battery').map((p) => p.id));
	const swap = (ref: { part: string; terminal: string }) =>
		batteries.has(ref.part) ? { part: ref.part, terminal: ref.terminal === '+' ? '-' : '+' } : ref;
	return assertDocument({
		...doc,
		vehicle: { ...doc.vehicle, earth: doc.vehicle.earth === 'positive' ? 'negative' : 'positive' },
		wires: doc.wires.map((w) => ({ ...w, from: swap(w.from), to: swap(w.to) }))
	});
}
