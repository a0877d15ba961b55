import { fromMm, parseLengthWithUnit, type Units } from '$lib/trade/units';
import { common } from './common-params';
import { allows, defineRegistry } from './registry';
import { firstPerField, refusal, type Checked, type Refusal } from './refusal';

// The photo reading's parameters (POST /api/v1/photos/:id/reading and the reading page): the taps
// on the photo and the wheel's diameter when the user knows it. The page and the route both call
// `checkPhotoTaps`, so the page refuses before sending what the API would refuse, in the same words.

/** The most tooth tips one reading takes. */
export const maxTips = 24;

export interface Pt {
	x: number;
	y: number;
}

export interface PhotoTaps {
	/** Pixel coordinates in the image as stored (upright; x right, y down). */
	centre: Pt;
	tips: Pt[];
	/** The outside diameter given, in mm whatever units it was typed in. */
	odMm?: number;
	/** The units the diameter was given in; the designer opens in them. */
	units: Units;
}

export const photoParams = defineRegistry([
	{
		name: 'centre',
		label: 'Centre',
		help: 'The wheel’s centre as tapped on the photo: {x, y} in the stored image’s pixels, x right, y down.',
		kind: 'free',
		required: true,
		allows: 'a point {x, y} in image pixels'
	},
	{
		name: 'tips',
		label: 'Tooth tips',
		help: 'The tips of a few teeth as tapped, each {x, y} in image pixels; 3 or more, spread round the wheel, help on a tilted photo.',
		kind: 'free',
		required: true,
		allows: `1 to ${maxTips} tooth-tip points {x, y} in image pixels`
	},
	{ ...common.od, help: 'Optional: measured across the tooth tips. Gives the designer the diameter.' },
	common.units,
	{
		name: 'odMm',
		label: 'Outside diameter in mm (older name)',
		help: 'The older name of od: a number of millimetres. Give od with units instead; odMm is still read.',
		kind: 'number',
		min: 10,
		max: 2000,
		unit: ' mm'
	}
]);

const isPt = (p: unknown): p is Pt =>
	typeof p === 'object' &&
	p !== null &&
	!Array.isArray(p) &&
	[(p as Pt).x, (p as Pt).y].every((v) => typeof v === 'number' && Number.isFinite(v));

/** A scalar parameter as text: JSON numbers are taken as written; null for anything that is not text or a number. */
const scalar = (v: unknown): string | undefined | null =>
	v === undefined ? undefined : typeof v === 'string' ? v : typeof v === 'number' ? String(v) : null;

/**
 * The photo reading's parameters checked: the taps' shape, the diameter (`od` read in `units`,
 * fractions of an inch allowed, or the older `odMm` in mm), and with the photo's size, that every
 * tap is on the photo. Refusals in the order found, the first per field.
 */
export function checkPhotoTaps(input: Readonly<Record<string, unknown>>, photo?: { width: number; height: number }): Checked<PhotoTaps> {
	const found: Refusal[] = [];
	const units: Units = input.units === 'in' ? 'in' : 'mm';
	const scalars: Record<string, string | undefined> = {};
	for (const name of ['od', 'units', 'odMm']) {
		const text = scalar(input[name]);
		if (text === null) found.push(refusal(name, allows(photoParams.get(name)!, units)));
		else scalars[name] = text;
	}
	// The registry reads the scalars; the taps are read here, it only needs to know they were given.
	const given = (v: unknown) => (v === undefined || v === null ? undefined : 'given');
	const read = photoParams.read({ ...scalars, centre: given(input.centre), tips: given(input.tips) }, units);
	if (!read.ok) found.push(...read.refusals);

	const { centre, tips } = input;
	const centreOk = isPt(centre);
	const tipsOk = Array.isArray(tips) && tips.length >= 1 && tips.length <= maxTips && tips.every(isPt);
	if (given(centre) && !centreOk) found.push(refusal('centre', allows(photoParams.get('centre')!, units)));
	if (given(tips) && !tipsOk) found.push(refusal('tips', allows(photoParams.get('tips')!, units)));
	if (scalars.od && scalars.odMm) found.push(refusal('odMm', 'give the diameter once: od with units, or this older name alone'));
	if (photo) {
		const off = (p: Pt) => p.x < 0 || p.y < 0 || p.x > photo.width || p.y > photo.height;
		const onPhoto = `inside the photo, 0 to ${photo.width} across and 0 to ${photo.height} down`;
		if (centreOk && off(centre)) found.push(refusal('centre', onPhoto));
		if (tipsOk && tips.some(off)) found.push(refusal('tips', onPhoto));
	}
	if (found.length || !read.ok || !centreOk || !tipsOk) return { ok: false, refusals: firstPerField(found) };
	const odMm = (read.value.od ?? read.value.odMm) as number | undefined;
	// A diameter typed with its own unit ("4 in" on a mm form) is the unit chosen: the designer opens in it.
	const odUnit = scalars.od ? parseLengthWithUnit(scalars.od, units) : null;
	const chosen: Units = odUnit?.ok && odUnit.unit !== null ? (odUnit.unit === 'in' ? 'in' : 'mm') : units;
	// Only x and y: whatever else came with a point is not stored with the reading.
	const pt = (p: Pt): Pt => ({ x: p.x, y: p.y });
	return { ok: true, value: { centre: pt(centre), tips: tips.map(pt), units: chosen, ...(odMm === undefined ? {} : { odMm }) } };
}

/** A diameter in mm as the user would type it back in their units: mm to 0.01, inches to 0.0001. */
export function diameterText(mm: number, units: Units): string {
	const step = units === 'in' ? 10_000 : 100;
	return String(Math.round(fromMm(mm, units) * step) / step);
}
