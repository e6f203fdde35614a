/**
 * Wire resistance from cross-section and length.
 *
 * Copper: the International Annealed Copper Standard (IEC 60028) fixes the resistivity at
 * 20 °C as 1/58 Ω·mm²/m and the temperature coefficient at 20 °C as 0.00393 per kelvin.
 * AWG: d = 0.127 mm × 92^((36 − n)/39) (ASTM B258), with gauges 0, 00, 000, 0000 as 0, −1, −2, −3.
 */

/** Resistivity of annealed copper at 20 °C (Ω·mm²/m), IEC 60028. */
export const COPPER_RESISTIVITY_20C = 1 / 58;
/** Temperature coefficient of resistance of annealed copper at 20 °C (1/K), IEC 60028. */
export const COPPER_TEMPERATURE_COEFFICIENT = 0.00393;

export type WireSize = { mm2: number } | { awg: number };

/** Diameter of a solid AWG conductor (mm), ASTM B258 formula. */
export function awgDiameterMm(awg: number): number {
	if (!Number.isFinite(awg) || awg < -3 || awg > 40) {
		throw new Error(`awgDiameterMm: gauge ${awg} is outside 0000 (−3) to 40`);
	}
	return 0.127 * Math.pow(92, (36 - awg) / 39);
}

/** Cross-section of an AWG conductor (mm²). */
export function awgAreaMm2(awg: number): number {
	const d = awgDiameterMm(awg);
	return (Math.PI / 4) * d * d;
}

/** Cross-section in mm² of either form of size. */
export function crossSectionMm2(size: WireSize): number {
	if ('mm2' in size) {
		if (!(size.mm2 > 0)) throw new Error(`crossSectionMm2: cross-section ${size.mm2} mm² must be above 0`);
		return size.mm2;
	}
	return awgAreaMm2(size.awg);
}

/**
 * Resistance of a copper wire (Ω): R = ρ₂₀ · L / A · (1 + α (T − 20)).
 * @example wireResistance({ size: { mm2: 1 }, lengthM: 1 }) // ≈ 0.01724 Ω
 */
export function wireResistance({
	size,
	lengthM,
	temperatureC = 20
}: {
	size: WireSize;
	lengthM: number;
	temperatureC?: number;
}): number {
	if (!(lengthM >= 0)) throw new Error(`wireResistance: length ${lengthM} m must be 0 or more`);
	const area = crossSectionMm2(size);
	return (
		((COPPER_RESISTIVITY_20C * lengthM) / area) *
		(1 + COPPER_TEMPERATURE_COEFFICIENT * (temperatureC - 20))
	);
}

/** Resistance per kilometre at 20 °C (Ω/km), the unit of IEC 60228 tables. */
export function ohmsPerKm(size: WireSize): number {
	return wireResistance({ size, lengthM: 1000 });
}
