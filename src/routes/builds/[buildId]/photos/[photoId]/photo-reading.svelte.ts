// The photo reading page's state: the taps (kept in the stored image's pixels, x right, y down,
// whatever size the photo is shown at), the known diameter, and the answer. The page checks with
// the API's own check (`checkPhotoTaps`) before it sends, so both refuse in the same words.
import { callApi } from '$lib/api-client';
import type { UndoOffer } from '$lib/components/ui/UndoNotice.svelte';
import { convertLengths, type SwitchMemory } from '$lib/params';
import { checkPhotoTaps, diameterText, maxTips, photoParams, type Pt } from '$lib/schemas/photo';
import { byField, type Refusal } from '$lib/schemas/refusal';
import type { Units } from '$lib/trade/units';

export interface ReadingAnswer {
	teeth: number;
	missing: number;
	gaps?: { first: number; count: number }[];
	/** Image angle of the gap's middle: degrees counter-clockwise from +x, y up. */
	gapAngleDeg?: number;
	pitchDeg?: number;
	duty?: number;
	confidence?: number;
	toothCount?: number;
	radiusPx?: number;
	mmPerPx?: number;
}

/** The last stored photo reading of a photo, with its taps (the page's load). */
export interface StoredReading {
	taps: { centre: Pt; tips: Pt[]; odMm?: number; units?: Units };
	reading: Record<string, unknown>;
	design: Record<string, string>;
}

export interface Result {
	reading: ReadingAnswer;
	design: Record<string, string>;
	stored: boolean;
	/** Read on an earlier visit (shown from the photo's stored reading). */
	earlier: boolean;
	/** The taps it was read from, to tell when they have changed since. */
	key: string;
}

interface Photo {
	id: string;
	width: number;
	height: number;
}

const tapKey = (c: Pt | null, t: Pt[]) => JSON.stringify([c, t]);

/** Refused fields shown beside their control; the rest go in the alert, named by their label. */
const besideTheirField = ['od', 'units'];
/** What may be refused that is no parameter: the photo itself, the request. */
const otherLabels: Record<string, string> = { image: 'Photo', body: 'Request', form: 'Request' };

const confidenceWords = (c: number | undefined) => (typeof c !== 'number' ? '' : c < 0.6 ? 'low' : c >= 0.8 ? 'good' : 'fair');

/** Every instruction the page can show: the page reserves room for the longest, so the photo never moves when one changes. */
export const steps = {
	centre: 'Tap the centre of the wheel.',
	firstTip: 'Now tap the tip of a tooth.',
	fewTips: 'Read the teeth now, or tap a few more tips spread round the wheel first (they help on a tilted photo).',
	enough: 'Enough taps: read the teeth.',
	most: `That is ${maxTips} tips, the most a reading takes: read the teeth.`,
	reading: 'Reading the teeth…',
	found: (r: Pick<ReadingAnswer, 'teeth' | 'missing' | 'confidence'>) =>
		`Found ${r.teeth}-${r.missing}, confidence ${confidenceWords(r.confidence) || 'not known'}: start a design from it, or move the taps and read again.`,
	changed: 'The taps have changed since the reading: read the teeth again.',
	fixDiameter: 'Correct the outside diameter as the note beside it says, then read the teeth again.',
	fixTaps: 'Some taps were refused (the note under Taps says why): undo them, tap again, then read the teeth.',
	tryAgain: 'The reading did not go through (the note under Taps says why): read the teeth again.'
};

/** The longest each instruction can be, for the room kept above the photo. */
export const everyStep: readonly string[] = [
	...Object.values(steps).filter((s): s is string => typeof s === 'string'),
	steps.found({ teeth: 720, missing: 719, confidence: undefined })
];

export class PhotoReading {
	readonly photo: Photo;
	centre = $state<Pt | null>(null);
	tips = $state<Pt[]>([]);
	odText = $state('');
	units = $state<Units>('mm');
	result = $state<Result | null>(null);
	refusals = $state<Refusal[]>([]);
	/** A failure that is no refusal (the server not reached …). */
	message = $state<string | null>(null);
	reading = $state(false);

	readonly fresh = $derived(this.result !== null && this.result.key === tapKey(this.centre, this.tips));
	readonly errors = $derived(byField(this.refusals));
	readonly alerts = $derived([
		...this.refusals
			.filter((r) => !besideTheirField.includes(r.field))
			.map((r) => `${otherLabels[r.field] ?? photoParams.label(r.field)}: ${r.message}`),
		...(this.message ? [this.message] : [])
	]);
	/** What to do next, in one line that follows the state: the page shows it above the photo. */
	readonly step = $derived.by(() => {
		if (this.reading) return steps.reading;
		if (this.refusals.some((r) => r.field === 'od' || r.field === 'units')) return steps.fixDiameter;
		if (this.refusals.some((r) => r.field === 'centre' || r.field === 'tips')) return steps.fixTaps;
		if (this.refusals.length || this.message) return steps.tryAgain;
		if (this.result && this.fresh) return steps.found(this.result.reading);
		if (this.result && this.centre) return steps.changed;
		if (!this.centre) return steps.centre;
		if (!this.tips.length) return steps.firstTip;
		if (this.tips.length < 3) return steps.fewTips;
		return this.tips.length < maxTips ? steps.enough : steps.most;
	});
	readonly tapsSaid = $derived(
		!this.centre ? 'Nothing tapped yet.' : `Centre placed; ${this.tips.length} tooth ${this.tips.length === 1 ? 'tip' : 'tips'}.`
	);

	constructor(photo: Photo, stored: StoredReading | null) {
		this.photo = photo;
		if (!stored) return;
		this.centre = stored.taps.centre;
		this.tips = stored.taps.tips;
		this.units = stored.taps.units ?? 'mm';
		this.odText = stored.taps.odMm ? diameterText(stored.taps.odMm, this.units) : '';
		this.result = {
			reading: stored.reading as unknown as ReadingAnswer,
			design: stored.design,
			stored: true,
			earlier: true,
			key: tapKey(stored.taps.centre, stored.taps.tips)
		};
	}

	private forget(...fields: string[]) {
		this.refusals = this.refusals.filter((r) => !fields.includes(r.field));
	}

	place(at: Pt) {
		this.forget('centre', 'tips');
		this.message = null;
		if (!this.centre) this.centre = at;
		else if (this.tips.length < maxTips) this.tips.push(at);
	}

	undo() {
		if (this.tips.length) this.tips.pop();
		else this.centre = null;
	}

	/** Start again throws the taps away: the offer to put them back. */
	startedAgain = $state<UndoOffer | null>(null);
	/** The taps and diameter in one string: a change to it ends the offer to undo. */
	readonly tapsState = $derived(`${tapKey(this.centre, this.tips)} ${this.odText} ${this.units}`);

	startAgain() {
		const before = { centre: this.centre, tips: [...this.tips], result: this.result };
		this.centre = null;
		this.tips = [];
		this.result = null;
		this.refusals = [];
		this.message = null;
		this.startedAgain = {
			message: 'Taps cleared.',
			undo: () => {
				this.centre = before.centre;
				this.tips = before.tips;
				this.result = before.result;
			}
		};
	}

	setOd(text: string) {
		this.odText = text;
		this.forget('od');
	}

	/** What the unit switches wrote over the diameter, so switching back gives it as typed (`3 1/2`). */
	#switchMemory: SwitchMemory = {};

	/**
	 * Another unit system: a diameter already typed is turned into it, so it still says the same size
	 * (one typed with its own unit already does, and stays as typed).
	 */
	setUnits(units: Units) {
		const converted = convertLengths({ od: this.odText }, ['od'], this.units, units, this.#switchMemory);
		if (converted.od !== undefined) this.odText = converted.od;
		this.units = units;
		this.forget('od', 'units');
	}

	async read() {
		if (!this.centre || !this.tips.length || this.reading) return;
		this.message = null;
		const od = this.odText.trim();
		const body = { centre: $state.snapshot(this.centre), tips: $state.snapshot(this.tips), units: this.units, ...(od ? { od } : {}) };
		const checked = checkPhotoTaps(body, this.photo);
		this.refusals = checked.ok ? [] : checked.refusals;
		if (!checked.ok) return;
		const key = tapKey(this.centre, this.tips);
		this.reading = true;
		const answer = await callApi('POST', `/api/v1/photos/${encodeURIComponent(this.photo.id)}/reading`, body);
		this.reading = false;
		const a = answer.body as typeof answer.body & { reading: ReadingAnswer; design: Record<string, string>; stored?: boolean };
		if (answer.ok) this.result = { reading: a.reading, design: a.design, stored: a.stored === true, earlier: false, key };
		else if (a.refusals?.length) this.refusals = a.refusals;
		else this.message = a.message ?? `The reading failed (status ${answer.status}); try again.`;
	}
}
