// Words and units the drawing board shows for part kinds and their parameters. The parameters
// themselves (names, ranges, defaults) come from the circuit core's schemas; this adds only
// what a person reads.
import { PARAM_SCHEMAS, PART_KINDS, type PartKind } from '$lib/circuit/parts';

export const KIND_NAMES: Record<PartKind, string> = {
	battery: 'Battery',
	'earth-point': 'Earth point',
	fuse: 'Fuse',
	switch: 'Switch',
	relay: 'Relay',
	lamp: 'Lamp',
	gauge: 'Gauge',
	sender: 'Sender',
	stabilizer: 'Voltage stabilizer',
	resistor: 'Resistor',
	motor: 'Motor',
	'ignition-coil': 'Ignition coil',
	connector: 'Connector',
	splice: 'Splice',
	generator: 'Generator',
	load: 'Other load'
};

/** Kinds in the order the "add part" tray lists them: what a loom is mostly made of first. */
export const TRAY_ORDER: PartKind[] = [
	'battery',
	'earth-point',
	'fuse',
	'switch',
	'lamp',
	'relay',
	'gauge',
	'sender',
	'stabilizer',
	'resistor',
	'motor',
	'generator',
	'ignition-coil',
	'connector',
	'splice',
	'load'
];

export type ParamInfo = {
	label: string;
	/** Unit symbol as written after the value. */
	unit?: string;
	/** When a field is blank, what is used instead. */
	blank?: string;
	step?: number;
};

export const PARAM_INFO: Record<string, ParamInfo> = {
	emf: { label: 'Open-circuit voltage', unit: 'V', blank: '2.1 V per cell', step: 0.1 },
	internalResistance: { label: 'Internal resistance', unit: 'Ω', step: 0.001 },
	chargingVoltage: { label: 'Charging voltage', unit: 'V', blank: 'about 14.2 V on 12 V', step: 0.1 },
	resistance: { label: 'Resistance', unit: 'Ω', step: 0.001 },
	rating: { label: 'Rating', unit: 'A', step: 1 },
	blown: { label: 'Blown' },
	role: { label: 'Role' },
	contactResistance: { label: 'Contact resistance', unit: 'Ω', step: 0.001 },
	coilResistance: { label: 'Coil resistance (85–86)', unit: 'Ω', step: 1 },
	pullIn: { label: 'Pull-in voltage', unit: 'V', blank: '0.6 × system voltage', step: 0.1 },
	dropOut: { label: 'Drop-out voltage', unit: 'V', blank: '0.25 × system voltage', step: 0.1 },
	volts: { label: 'Rated voltage', unit: 'V', blank: 'the system voltage', step: 1 },
	watts: { label: 'Rated power', unit: 'W', step: 0.1 },
	fullScaleCurrent: { label: 'Full-scale current', unit: 'A', step: 0.01 },
	ohmsAt0: { label: 'Resistance at empty / cold', unit: 'Ω', step: 1 },
	ohmsAt1: { label: 'Resistance at full / hot', unit: 'Ω', step: 1 },
	taper: { label: 'Taper' },
	position: { label: 'Position (0 = empty, 1 = full)', step: 0.05 },
	setPoint: { label: 'Average output', unit: 'V', blank: '10 V per 12 V', step: 0.1 },
	outputResistance: { label: 'Output resistance', unit: 'Ω', step: 0.01 },
	heaterResistance: { label: 'Heater resistance', unit: 'Ω', step: 1 },
	primaryResistance: { label: 'Primary resistance (15–1)', unit: 'Ω', step: 0.1 },
	armatureResistance: { label: 'Armature resistance (D–E)', unit: 'Ω', step: 0.01 },
	outputVoltage: { label: 'Output voltage', unit: 'V', blank: 'the charging voltage', step: 0.1 },
	positions: { label: 'Positions' },
	defaultPosition: { label: 'Usual position' },
	pins: { label: 'Pin pairs' },
	between: { label: 'Between terminals' }
};

/** Parameters edited by dedicated controls (lists of pairs) rather than one field. */
export const STRUCTURED_PARAMS = new Set(['positions', 'defaultPosition', 'pins', 'between']);

export type ParamField = { name: string; info: ParamInfo; type: 'number' | 'boolean' | 'choice'; options?: string[]; optional: boolean };

/** The parameter fields of a kind, read from the circuit core's schema for it. */
export function paramFields(kind: PartKind): ParamField[] {
	const shape = PARAM_SCHEMAS[kind].shape as Record<string, { def?: unknown; _zod: { def: Record<string, unknown> } }>;
	return Object.entries(shape)
		.filter(([name]) => !STRUCTURED_PARAMS.has(name))
		.map(([name, schema]) => {
			let def = schema._zod.def;
			let optional = false;
			// Unwrap default/optional wrappers to find the value type.
			while (def.type === 'default' || def.type === 'optional' || def.type === 'prefault') {
				if (def.type === 'optional') optional = true;
				def = (def.innerType as { _zod: { def: Record<string, unknown> } })._zod.def;
			}
			const info = PARAM_INFO[name] ?? { label: name };
			if (def.type === 'boolean') return { name, info, type: 'boolean' as const, optional };
			if (def.type === 'enum') return { name, info, type: 'choice' as const, options: Object.values(def.entries as Record<string, string>), optional };
			return { name, info, type: 'number' as const, optional };
		});
}

export const ALL_KINDS = PART_KINDS;
