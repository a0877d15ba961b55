// The photo reading page's state: the taps (kept in the stored image's pixels, x right, y down,
// whatever size the photo is shown at), the known diameter, and the answer. The page checks with
// the API's own check (`checkPhotoTaps`) before it sends, so both refuse in the same words.
import { callApi } from '$lib/api-client';
import type { UndoOffer } from '$lib/components/ui/UndoNotice.svelte';
import { convertLengths, type SwitchMemory } from '$lib/params';
import { checkPhotoTaps, diameterText, maxTips, photoParams, type Pt } from '$lib/schemas/photo';
import { byField, type Refusal } from '$lib/schemas/refusal';
import type { Units } from '$lib/trade/units';
import { clampTo, confidenceWord, overlayFacts, type ConfidenceWord, type Ellipse, type ToothSeen, type Unseen } from './overlay-geometry';

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
	/** Issue 17's reader adds these; older readings (and stored ones) may lack them. */
	ellipse?: Ellipse;
	teethAt?: ToothSeen[];
	unseen?: Unseen[];
	confidenceWord?: ConfidenceWord;
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

/** Every instruction the page can show: the page reserves room for the longest, so the photo never moves when one changes. */
export const steps = {
	centre: 'Tap the centre of the wheel.',
	firstTip: 'Now tap the tip of a tooth.',
	fewTips: 'Read the teeth now, or tap a few more tips spread round the wheel first (they help on a tilted photo).',
	enough: 'Enough taps: read the teeth.',
	most: `That is ${maxTips} tips, the most a reading takes: read the teeth.`,
	reading: 'Reading the teeth…',
	found: (r: Pick<ReadingAnswer, 'teeth' | 'missing' | 'confidence' | 'confidenceWord'>) =>
		`Found ${r.teeth}-${r.missing}, confidence ${confidenceWord(r.confidenceWord, r.confidence) ?? 'not known'}: start a design from it, or drag the taps to correct them.`,
	changed: 'The taps have changed since the reading: read the teeth again.',
	fixDiameter: 'Correct the outside diameter as the note beside it says, then read the teeth again.',
	fixTaps: 'Some taps were refused (the note under Taps says why): undo them, tap again, then read the teeth.',
	tryAgain: 'The reading did not go through (the note under Taps says why): read the teeth again.'
};

/** The longest each instruction can be, for the room kept above the photo. */
export const everyStep: readonly string[] = [
	...Object.values(steps).filter((s): s is string => typeof s === 'string'),
	steps.found({ teeth: 720, missing: 719, confidence: undefined }),
	steps.found({ teeth: 720, missing: 719, confidenceWord: 'medium' })
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
	/** What the last refusal said would help in this photo, and the tip ellipse it fitted (drawn so a bad fit shows). */
	advice = $state<string[]>([]);
	fitTried = $state<Ellipse | null>(null);
	/** A reading was asked for on these taps: from then on, a corrected tap reads again by itself. */
	asked = $state(false);
	/** Taps moved while a reading was on its way: read once more when it is back. */
	#again = false;

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
		// The stored reading is on screen: a tap corrected now reads again, as after a reading asked for here.
		this.asked = true;
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

	/**
	 * A tapped point dragged or nudged (`which` is 'centre' or the tip's index), kept on the photo.
	 * The old answer stays, shown as out of date, until the corrected taps are read.
	 */
	move(which: 'centre' | number, to: Pt) {
		const at = clampTo({ x: Math.round(to.x * 10) / 10, y: Math.round(to.y * 10) / 10 }, this.photo.width, this.photo.height);
		if (which === 'centre') {
			if (this.centre) this.centre = at;
		} else if (which >= 0 && which < this.tips.length) this.tips[which] = at;
		this.forget('centre', 'tips');
	}

	/** A drag let go or the arrow keys let go: once a reading was asked for, the corrected taps are read again at once. */
	corrected() {
		if (this.asked && this.centre && this.tips.length) void this.read();
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
		this.advice = [];
		this.fitTried = null;
		this.asked = false;
		this.startedAgain = {
			message: 'Taps cleared.',
			undo: () => {
				this.centre = before.centre;
				this.tips = before.tips;
				this.result = before.result;
				this.asked = before.result !== null;
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
		if (!this.centre || !this.tips.length) return;
		if (this.reading) {
			this.#again = true;
			return;
		}
		this.asked = true;
		this.message = null;
		this.advice = [];
		this.fitTried = null;
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
		else if (a.refusals?.length) {
			this.refusals = a.refusals;
			const facts = overlayFacts(a);
			this.advice = facts.advice;
			this.fitTried = facts.ellipse;
		} else this.message = a.message ?? `The reading failed (status ${answer.status}); try again.`;
		if (this.#again) {
			this.#again = false;
			await this.read();
		}
	}
}
