import type { z } from 'zod';
import {
	compareQuery,
	createBuild,
	createDesign,
	cuttingPackageInput,
	engineProfile,
	restoreRevision,
	saveRecord,
	saveRevision,
	buildQuery,
	revisionListQuery,
	buildSheetQuery,
	updateBuild
} from '$lib/schemas/build';
import { listQuery } from '$lib/schemas/build-lists';
import { cuttingDetails } from '$lib/schemas/cutting-package';
import { buildSheetParams, phasingParams } from '$lib/schemas/phasing';
import { maxTips, photoParams } from '$lib/schemas/photo';
import type { Registry } from '$lib/schemas/registry';
import { degreeWheelRegistry } from '$lib/schemas/degree-wheel';
import { edgeLogDesignParams } from '$lib/schemas/edge-log-design';
import { signalParams } from '$lib/schemas/signal';
import { caseParams } from '$lib/schemas/signal-cases';
import { tapeRegistry } from '$lib/schemas/tape';
import { tdcRegistry } from '$lib/schemas/tdc';
import { timingCardRegistry } from '$lib/schemas/timing-card';
import { wheelParams } from '$lib/schemas/wheel-params';
import { empty, file, json, type Answer, type Extra } from './answers';
import type { JsonSchema, Query } from './registry-params';

// Every route under src/routes/api/v1, one entry per method, keyed by its path as the document
// writes it ({buildId} for [buildId]). The document, the API page and the coverage test all read
// this table: a new route is one entry here (document.test.ts fails until it is added).

export const tags = {
	Wheel: 'The trigger wheel designer: a wheel’s numbers and its files, from the wheel’s parameters. No account needed.',
	'Tape and TDC': 'Degree tape, timing-light card and the TDC finder. No account needed.',
	'Phasing and build sheet': 'The phasing check and the build sheet from parameters. No account needed.',
	Builds: 'A workshop’s builds and what they hold (signed in).',
	Designs: 'Wheel designs and their revisions, which are never changed once saved (signed in).',
	Photos: 'Wheel photos and reading a wheel from one (signed in).',
	'Cutting packages': 'The DXF and shop drawing of a revision, e-mailed to a fabricator (signed in).',
	Signal: 'The signal check: will the ECU find the gap at every speed; a recorded edge log read against the design. No account needed.',
	Document: 'This document.'
} as const;

export type Tag = keyof typeof tags;

export interface Operation {
	tag: Tag;
	summary: string;
	description?: string;
	/** Who may call it: anyone, or a signed-in member whose role in the object's workshop allows reading or writing. */
	access?: 'anyone' | 'read' | 'edit';
	query?: Query;
	/** A zod schema, or JSON Schema for a body no zod schema states (a tool's own check reads it). */
	body?:
		| { json: z.ZodType | JsonSchema; params?: Registry | readonly Registry[] }
		| { multipart: JsonSchema }
		/** A body that is a file in one of several types (an edge log as text/csv or a multipart form). */
		| { content: Record<string, JsonSchema> };
	answer: Answer;
	/** Answers beyond what access, query and body imply (a 409, a 429 …); one given for 400 replaces the shared one. */
	also?: readonly Extra[];
	example?: { query?: Record<string, string>; body?: unknown };
}

export type Method = 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';
export type RouteTable = Record<string, Partial<Record<Method, Operation>>>;

/** Path parameters by name; a name not here is an object's id (a UUID). */
export const pathParams: Record<string, JsonSchema> = {
	number: { type: 'integer', minimum: 1, maximum: 1_000_000, description: 'The revision number.' },
	file: { type: 'string', enum: ['wheel.dxf', 'wheel.svg', 'wheel.pdf', 'wheel.stl'], description: 'Which file of the revision.' }
};

const wheelFiles = { dxf: 'application/dxf', svg: 'image/svg+xml', pdf: 'application/pdf', stl: 'model/stl' } as const;
const wheelExample = { query: { teeth: '36', missing: '1', od: '120', depth: '5', bore: '20', thickness: '3' } };
const nameTaken: Extra = { status: 409, description: 'Another one in this workshop or build has that name (code `conflict`).' };
const stale: Extra = {
	status: 409,
	description: 'Someone saved a newer revision since `baseRevision` (code `stale`); nothing was written.',
	fields: { baseRevision: 'integer', head: 'object: the newest revision', yours: 'object: what this save sent' }
};
const badCursor: Extra = {
	status: 400,
	description: 'A `cursor` this list did not give (code `invalid`, `errors.cursor`); start again without it.',
	fields: { errors: 'object', refusals: 'array' }
};
const point = { type: 'object', required: ['x', 'y'], properties: { x: { type: 'number' }, y: { type: 'number' } } };

const wheelSummary = {
	units: 'string: mm or in, as asked',
	pattern: 'string',
	positions: 'integer',
	teethPresent: 'integer',
	pitchDeg: 'number',
	toothWidthDeg: 'number',
	pitchFrequencyHz: 'number: N·rpm/60 at the rev limit',
	teeth: 'array: each tooth’s position, leadDeg and trailDeg (wheel degrees from the first tooth after the gap)',
	gaps: 'array',
	rootDiameterMm: 'number',
	areaMm2: 'number',
	massG: 'number',
	unbalance: 'object: gmm, heavySideDeg, forceAtRpmN, rpm',
	permissible: 'object: ISO 21940-11 permissible residual unbalance',
	balanceSuggestion: 'object|null: holes that bring the residual within the permissible',
	balanceNote: 'string|null: why there is no suggestion',
	warnings: 'array'
};

const signalAnswer = {
	cycleDeg: 'number: crank degrees of one engine cycle',
	compression: 'array: each cylinder’s compression event (fromDeg, tdcDeg, toDeg)',
	cases:
		'array: per speed case its syncMargin (a fraction; below 0 the ECU loses sync), gapRatioMin, normalRatioMax, worst (crankDeg, cylinder, what), missedPerCycle, falsePerCycle and the first cycle’s spaces',
	sweep: 'array: the worst syncMargin over the cases at each clocking (clockingDeg, wheel degrees)',
	current: 'object: toothAtTdc, syncMargin',
	best: 'object: toothAtTdc, syncMargin, keywayShiftDeg (add to the designer’s keywayAngle)',
	sensor: 'object: kind, topRpm, hz, maxHz, vr (crankingRpmAtThreshold, estimated)',
	warnings: 'array: code and message'
};
const edgeLogAnswer = {
	kind: 'string: times or spaces',
	unit: 'string: s, ms or us',
	edges: 'integer',
	pattern: 'object|null: teeth, missing, gapAt (edge index of tooth 0), gapRow',
	matchesDesign: 'boolean|null',
	designDifference: 'string|null',
	missingEdges: 'object: count, at (row, count)',
	extraEdges: 'object: count, rows',
	speedSwingPct: 'object|null: perTurn, mean, max',
	runout: 'object|null: amplitudePct, phaseDeg',
	turns: 'integer',
	meanRpm: 'number|null',
	notes: 'array'
};

export const routes: RouteTable = {
	'/signal': {
		GET: {
			tag: 'Signal',
			summary: 'Will the ECU find the gap: the sync margin per speed case',
			description:
				'The phasing check’s wheel and engine parameters, plus `swing` (% peak to peak) and `accel` (rpm/s): either one makes a single case at `rpm`; otherwise cranking, idle, free rev and the rev limit are checked. A space counts as the gap when it is longer than `ratio` times the space before it.',
			query: signalParams,
			answer: json('Every case with its sync margin, the clocking sweep and the sensor.', signalAnswer),
			example: { query: { teeth: '36', missing: '1', toothAtTdc: '9', layout: 'single-4', rpm: '9000' } }
		}
	},
	'/signal/edges.csv': {
		GET: {
			tag: 'Signal',
			summary: 'The tooth-edge table over one engine cycle',
			description: 'One row per tooth edge: `edge,tooth,kind,wheel_deg,crank_deg,time_ms` (time at the one case given, or at cranking).',
			query: signalParams,
			answer: file('The CSV.', 'text/csv'),
			example: { query: { teeth: '36', missing: '1', toothAtTdc: '9', layout: 'single-4' } }
		}
	},
	'/signal/log': {
		POST: {
			tag: 'Signal',
			summary: 'Read a recorded edge log against the design',
			description:
				'One edge time or tooth space per row (docs/edge-log-format.md). Scripts send `text/csv`: `text/plain` and multipart posts from another origin are refused. Stores nothing.',
			query: edgeLogDesignParams,
			body: {
				content: {
					'text/csv': { type: 'string', description: 'The log, one value per row; an optional header names the unit and kind.' },
					'multipart/form-data': {
						type: 'object',
						required: ['log'],
						properties: { log: { type: 'string', format: 'binary', description: 'The log file.' } }
					}
				}
			},
			answer: json('The pattern found and how it compares with the design.', edgeLogAnswer),
			also: [{ status: 415, description: 'The body is not text/csv, text/plain or a multipart form.' }]
		}
	},
	'/wheel': {
		GET: {
			tag: 'Wheel',
			summary: 'A wheel’s numbers',
			query: wheelParams,
			answer: json('The wheel’s summary.', wheelSummary),
			example: wheelExample
		}
	},
	'/wheel.dxf': {
		GET: {
			tag: 'Wheel',
			summary: 'The wheel as DXF',
			description: 'DXF R12 in the wheel’s units: layer CUT (outline, bore, keyway, holes), layer ETCH (index mark, label).',
			query: wheelParams,
			answer: file('The DXF.', wheelFiles.dxf),
			example: wheelExample
		}
	},
	'/wheel.stl': {
		GET: {
			tag: 'Wheel',
			summary: 'The wheel as binary STL for a 3D-printed test-fit copy',
			description:
				'The cut outline with bore, keyway and holes extruded to `thickness`, in mm whatever `units` is. A printed wheel is for test-fit only: never run it on an engine.',
			query: wheelParams,
			answer: file('The STL (binary).', wheelFiles.stl),
			example: wheelExample
		}
	},
	'/wheel.svg': {
		GET: {
			tag: 'Wheel',
			summary: 'The wheel as SVG at true scale',
			query: wheelParams,
			answer: file('The SVG.', wheelFiles.svg),
			example: wheelExample
		}
	},
	'/wheel.pdf': {
		GET: {
			tag: 'Wheel',
			summary: 'The wheel as a 1:1 PDF template',
			description: 'Print at 100 % / actual size and check the calibration bars with a rule before cutting.',
			query: wheelParams,
			answer: file('The PDF.', wheelFiles.pdf),
			example: wheelExample
		}
	},
	'/tape': {
		GET: {
			tag: 'Tape and TDC',
			summary: 'A degree tape’s numbers',
			query: tapeRegistry,
			answer: json('The tape’s scale and where BTDC lies.', {
				units: 'string',
				hubDiameter: 'number: in units',
				perDegree: 'number: in units',
				length: 'number: in units',
				windowDeg: 'number|null',
				rotation: 'string',
				btdcSide: 'string: left or right of 0, the tape read upright',
				sides: 'object: the same in words, as printed',
				fitting: 'object',
				paper: 'string',
				strips: 'integer',
				pages: 'integer',
				warnings: 'array'
			}),
			example: { query: { diameter: '76.2', rotation: 'cw' } }
		}
	},
	'/tape.pdf': {
		GET: {
			tag: 'Tape and TDC',
			summary: 'The degree tape to print at actual size',
			description: 'Check the calibration bars with a rule; verify timing with a timing light before load.',
			query: tapeRegistry,
			answer: file('The PDF.', 'application/pdf'),
			example: { query: { diameter: '76.2', rotation: 'cw' } }
		}
	},
	'/degree-wheel.pdf': {
		GET: {
			tag: 'Tape and TDC',
			summary: 'A round degree wheel to print at actual size',
			description:
				'The tape’s scale round a disc the hub’s diameter, with a centre hole of `shaft`, BTDC and ATDC as on the tape, and calibration bars. Check the bars with a rule; verify timing with a timing light before load.',
			query: degreeWheelRegistry,
			answer: file('The PDF.', 'application/pdf'),
			example: { query: { diameter: '120', rotation: 'cw', shaft: '20' } }
		}
	},
	'/timing-card.pdf': {
		GET: {
			tag: 'Tape and TDC',
			summary: 'The timing-light card',
			query: timingCardRegistry,
			answer: file('The PDF.', 'application/pdf'),
			example: { query: { diameter: '76.2', curve: '1200:10, 3000:20' } }
		}
	},
	'/tdc': {
		GET: {
			tag: 'Tape and TDC',
			summary: 'True TDC from two piston-stop readings',
			description:
				'Or, with `distance` and `diameter`, from the marks measured along the rim (answers spreadDeg, halfSpreadDeg, fromEitherMark).',
			query: tdcRegistry,
			answer: json('Where TDC is and what to do about it.', {
				scale: 'string',
				arc: 'string',
				tdcDeg: 'number',
				spreadDeg: 'number',
				halfSpreadDeg: 'number',
				a: 'object',
				b: 'object',
				tdc: 'object: the reading of true TDC with its side',
				finding: 'string',
				remark: 'string|null',
				pointer: 'string|null',
				units: 'string',
				rimDistance: 'number: with a diameter, in units'
			}),
			example: { query: { a: '10 BTDC', b: '19 ATDC' } }
		}
	},
	'/phasing': {
		GET: {
			tag: 'Phasing and build sheet',
			summary: 'The phasing check',
			query: phasingParams,
			answer: json('The first-tooth offset to enter in the ECU, gap clearance and warnings.', {
				layout: 'string',
				mount: 'string',
				intervals: 'array',
				sensorMaxHz: 'number',
				input: 'string',
				toothAtTdc: 'number',
				measured: 'object|null',
				pitchDeg: 'number',
				resolutionDeg: 'number',
				firstToothOffsetDeg: 'number: crank degrees BTDC',
				pitchFrequencyHz: 'number',
				gapAtCrankingMs: 'number|null',
				gapClearanceDeg: 'array',
				warnings: 'array',
				clocking: 'object|null'
			}),
			example: { query: { teeth: '36', missing: '1', toothAtTdc: '9', rpm: '9000', layout: 'single-4' } }
		}
	},
	'/build-sheet.pdf': {
		GET: {
			tag: 'Phasing and build sheet',
			summary: 'A build sheet from parameters',
			description: 'The wheel’s parameters and the phasing check’s (shared names, one meaning), with the sheet’s own.',
			query: [buildSheetParams, phasingParams],
			answer: file('The PDF.', 'application/pdf'),
			example: { query: { od: '120', depth: '5', teeth: '36', missing: '1', toothAtTdc: '9', buildName: 'CB750' } }
		}
	},
	'/builds': {
		GET: {
			tag: 'Builds',
			summary: 'The builds of the current workshop',
			description:
				'`workshop` picks one of the caller’s workshops; `q` searches name and engine. Keyset paging: pass the answer’s `next` as `cursor` (with the same `q`, `sort` and `dir`) for the page after it; `next` is null on the last page. No total is counted. `page` is no longer read (the first page).',
			access: 'read',
			query: buildQuery,
			answer: json('One page of builds.', {
				workshop: 'object',
				role: 'string',
				builds: 'array',
				next: 'string|null: the `cursor` of the next page; null on the last',
				size: 'integer',
				sort: 'string',
				dir: 'string'
			})
		},
		POST: {
			tag: 'Builds',
			summary: 'A new build',
			access: 'edit',
			body: { json: createBuild },
			answer: json('Created; `location` names it.', { id: 'string' }, 201),
			also: [nameTaken],
			example: { body: { name: 'CB750 race', engine: 'Honda CB750, 4 cyl' } }
		}
	},
	'/builds/{buildId}': {
		GET: {
			tag: 'Builds',
			summary: 'A build with the newest 50 of each list it holds',
			description:
				'`next.<list>` is the cursor for that list’s own route (null when the 50 are all): `…/photos?cursor=`, `…/activity?cursor=`, …',
			access: 'read',
			answer: json('The build, each list newest first.', {
				role: 'string',
				build: 'object',
				steps: 'array: the job in order, each with state todo, done or stale',
				designs: 'array',
				headRevisions: 'object',
				tdcRecords: 'array',
				tapes: 'array',
				photos: 'array',
				cuttingPackages: 'array',
				activity: 'array',
				signalChecks: 'array',
				next: 'object: a cursor or null for each of tdcRecords, tapes, signalChecks, photos, cuttingPackages, activity'
			})
		},
		PATCH: {
			tag: 'Builds',
			summary: 'Rename a build or change its engine or notes',
			access: 'edit',
			body: { json: updateBuild },
			answer: json('Changed.', { id: 'string' }),
			also: [nameTaken],
			example: { body: { notes: 'Sensor bracket at 90° BTDC' } }
		},
		DELETE: { tag: 'Builds', summary: 'Delete a build with everything in it', access: 'edit', answer: empty('Deleted.') }
	},
	'/builds/{buildId}/engine': {
		PUT: {
			tag: 'Builds',
			summary: 'Store the build’s engine profile',
			description: 'The phasing check’s parameters, checked as `GET /phasing` checks them; answers the phasing result.',
			access: 'edit',
			body: { json: engineProfile, params: phasingParams },
			answer: json('Stored.', { params: 'object', layout: 'string', phasing: 'object' }),
			example: { body: { params: { teeth: '36', missing: '1', toothAtTdc: '9', layout: 'single-4' } } }
		}
	},
	'/builds/{buildId}/designs': {
		GET: { tag: 'Designs', summary: 'The build’s wheel designs', access: 'read', answer: json('The designs.', { designs: 'array' }) },
		POST: {
			tag: 'Designs',
			summary: 'A new wheel design, saved as its revision 1',
			access: 'edit',
			body: { json: createDesign, params: wheelParams },
			answer: json('Created; `location` names it.', { id: 'string', revision: 'integer' }, 201),
			also: [nameTaken],
			example: { body: { name: 'Crank wheel', params: wheelExample.query } }
		}
	},
	'/builds/{buildId}/tdc-records': {
		GET: {
			tag: 'Builds',
			summary: 'The build’s TDC records',
			access: 'read',
			query: listQuery,
			answer: json('50 a page, newest first; `next` for the page after, null on the last.', {
				tdcRecords: 'array',
				next: 'string|null: the cursor of the page after, null on the last'
			}),
			also: [badCursor]
		},
		POST: {
			tag: 'Builds',
			summary: 'Save a TDC record',
			description: 'Refusals of a tool parameter name `params.<field>`.',
			access: 'edit',
			body: { json: saveRecord, params: tdcRegistry },
			answer: json('Saved.', { id: 'string' }, 201),
			example: { body: { label: 'Cylinder 1', params: { a: '10 BTDC', b: '19 ATDC' } } }
		}
	},
	'/builds/{buildId}/tdc-records/{recordId}': {
		DELETE: { tag: 'Builds', summary: 'Delete a TDC record', access: 'edit', answer: empty('Deleted.') }
	},
	'/builds/{buildId}/tapes': {
		GET: {
			tag: 'Builds',
			summary: 'The build’s saved degree tapes',
			access: 'read',
			query: listQuery,
			answer: json('50 a page, newest first; `next` for the page after, null on the last.', {
				tapes: 'array',
				next: 'string|null: the cursor of the page after, null on the last'
			}),
			also: [badCursor]
		},
		POST: {
			tag: 'Builds',
			summary: 'Save a degree tape',
			description: 'Refusals of a tool parameter name `params.<field>`.',
			access: 'edit',
			body: { json: saveRecord, params: tapeRegistry },
			answer: json('Saved.', { id: 'string' }, 201),
			example: { body: { label: 'Crank pulley', params: { diameter: '76.2', rotation: 'cw' } } }
		}
	},
	'/builds/{buildId}/tapes/{recordId}': {
		DELETE: { tag: 'Builds', summary: 'Delete a saved degree tape', access: 'edit', answer: empty('Deleted.') }
	},
	'/builds/{buildId}/signal-checks': {
		GET: {
			tag: 'Builds',
			summary: 'The build’s saved signal checks',
			access: 'read',
			query: listQuery,
			answer: json('50 a page, newest first; `next` for the page after, null on the last.', {
				signalChecks: 'array',
				next: 'string|null: the cursor of the page after, null on the last'
			}),
			also: [badCursor]
		},
		POST: {
			tag: 'Builds',
			summary: 'Save a signal check',
			description:
				'The parameters `GET /api/v1/signal` takes, plus each speed case’s own (`idleRpm`, `freeRevRpm`, `<case>Swing`, `<case>Accel`); checked again and its margins worked out on the server. Refusals of a tool parameter name `params.<field>`.',
			access: 'edit',
			body: { json: saveRecord, params: [signalParams, caseParams] },
			answer: json('Saved, with each case’s sync margin.', { id: 'string', cases: 'array' }, 201),
			example: { body: { label: 'Cranking check', params: { teeth: '36', missing: '1', toothAtTdc: '9', layout: 'single-4' } } }
		}
	},
	'/builds/{buildId}/signal-checks/{recordId}': {
		DELETE: { tag: 'Builds', summary: 'Delete a saved signal check', access: 'edit', answer: empty('Deleted.') }
	},
	'/builds/{buildId}/activity': {
		GET: {
			tag: 'Builds',
			summary: 'The build’s activity log',
			access: 'read',
			query: listQuery,
			answer: json('50 a page, newest first; `next` for the page after, null on the last.', {
				activity: 'array',
				next: 'string|null: the cursor of the page after, null on the last'
			}),
			also: [badCursor]
		}
	},
	'/builds/{buildId}/build-sheet.pdf': {
		GET: {
			tag: 'Builds',
			summary: 'The build sheet of the saved build',
			description: 'Each download is logged as the sheet issued. `design` and `revision` pick the wheel (its newest revision otherwise).',
			access: 'read',
			query: buildSheetQuery,
			answer: file('The PDF.', 'application/pdf')
		}
	},
	'/builds/{buildId}/photos': {
		GET: {
			tag: 'Photos',
			summary: 'The build’s photos',
			access: 'read',
			query: listQuery,
			answer: json('50 a page, newest first; `next` for the page after, null on the last.', {
				photos: 'array',
				next: 'string|null: the cursor of the page after, null on the last'
			}),
			also: [badCursor]
		},
		POST: {
			tag: 'Photos',
			summary: 'Upload wheel photos',
			description:
				'JPEG, PNG or WebP, up to 12 at once; every file is checked by its bytes before any is stored (one refusal stores none).',
			access: 'edit',
			body: {
				multipart: {
					type: 'object',
					required: ['file'],
					properties: { file: { type: 'array', maxItems: 12, items: { type: 'string', contentMediaType: 'application/octet-stream' } } }
				}
			},
			answer: json('Stored (upright, metadata removed).', { photos: 'array' }, 201),
			also: [
				{ status: 400, description: 'Not a photo this takes, or none sent (code `invalid`, `errors.file`).', fields: { errors: 'object' } },
				{ status: 413, description: 'Over 20 MB per photo or 21 MB per upload.', fields: { errors: 'object' } }
			]
		}
	},
	'/photos/{photoId}': {
		GET: {
			tag: 'Photos',
			summary: 'The stored photo',
			access: 'read',
			answer: file('The photo (inline).', 'image/jpeg', 'image/png', 'image/webp')
		},
		DELETE: { tag: 'Photos', summary: 'Delete a photo', access: 'edit', answer: empty('Deleted.') }
	},
	'/photos/{photoId}/thumbnail': {
		GET: { tag: 'Photos', summary: 'The photo’s thumbnail', access: 'read', answer: file('The thumbnail (inline).', 'image/webp') }
	},
	'/photos/{photoId}/reading': {
		POST: {
			tag: 'Photos',
			summary: 'Read a wheel from a photo',
			description: 'Taps in the stored image’s pixels. Editors store the reading on the photo; readers may try one.',
			access: 'read',
			body: {
				json: {
					type: 'object',
					required: ['centre', 'tips'],
					properties: { centre: point, tips: { type: 'array', minItems: 1, maxItems: maxTips, items: point } }
				},
				params: photoParams
			},
			answer: json('The reading and the designer’s parameters from it.', { reading: 'object', design: 'object', stored: 'boolean' }),
			example: { body: { centre: { x: 812, y: 604 }, tips: [{ x: 1210, y: 598 }], od: '120', units: 'mm' } }
		}
	},
	'/builds/{buildId}/cutting-packages': {
		GET: {
			tag: 'Cutting packages',
			summary: 'Packages sent',
			access: 'read',
			query: listQuery,
			answer: json('50 a page, newest first; `next` for the page after, null on the last.', {
				cuttingPackages: 'array',
				next: 'string|null: the cursor of the page after, null on the last'
			}),
			also: [badCursor]
		},
		POST: {
			tag: 'Cutting packages',
			summary: 'E-mail a revision’s DXF and shop drawing to a fabricator',
			description: 'A copy goes to the sender. The newest revision unless `revision` is given.',
			access: 'edit',
			body: { json: cuttingPackageInput },
			answer: json('Sent and recorded.', { id: 'string', messageId: 'string', files: 'array', revision: 'integer', to: 'string' }, 201),
			also: [
				{ status: 429, description: 'Too many e-mails from this address, client or workshop (code `throttled`); nothing sent.' },
				{ status: 502, description: 'The mail server did not take the message (code `mail-failed`); nothing sent or recorded.' }
			]
		}
	},
	'/builds/{buildId}/cutting-packages/drawing.pdf': {
		GET: {
			tag: 'Cutting packages',
			summary: 'The shop drawing a package would carry',
			access: 'read',
			query: cuttingDetails,
			answer: file('The PDF.', 'application/pdf')
		}
	},
	'/builds/{buildId}/cutting-packages/{packageId}/drawing.pdf': {
		GET: { tag: 'Cutting packages', summary: 'A sent package’s shop drawing', access: 'read', answer: file('The PDF.', 'application/pdf') }
	},
	'/designs/{designId}': {
		GET: {
			tag: 'Designs',
			summary: 'A design and a page of its revisions, newest first',
			description:
				'At most 50 revisions a page; pass the answer’s `next` as `cursor` for the older ones (`next` is null on the last page). `q` keeps the revisions whose number it is or whose message holds it.',
			access: 'read',
			query: revisionListQuery,
			answer: json('The design.', {
				role: 'string',
				design: 'object',
				headRevision: 'integer: the newest revision’s number',
				revisions: 'array: this page, newest first',
				next: 'string|null: the `cursor` of the older revisions; null on the last page'
			})
		}
	},
	'/designs/{designId}/revisions': {
		GET: {
			tag: 'Designs',
			summary: 'A page of the design’s revisions, newest first',
			description: 'Paged as `GET /designs/{designId}` is: `cursor` from the answer’s `next`, `q` by number or message.',
			access: 'read',
			query: revisionListQuery,
			answer: json('The revisions.', { revisions: 'array', next: 'string|null: the `cursor` of the older revisions' })
		},
		POST: {
			tag: 'Designs',
			summary: 'Save a new revision',
			description: '`baseRevision` is the revision the edit started from.',
			access: 'edit',
			body: { json: saveRevision, params: wheelParams },
			answer: json('Saved.', { revision: 'integer' }, 201),
			also: [stale],
			example: { body: { baseRevision: 1, params: { ...wheelExample.query, bore: '25' }, message: 'Larger bore' } }
		}
	},
	'/designs/{designId}/revisions/{number}': {
		GET: { tag: 'Designs', summary: 'One revision', access: 'read', answer: json('The revision.', { revision: 'object' }) }
	},
	'/designs/{designId}/revisions/{number}/{file}': {
		GET: {
			tag: 'Designs',
			summary: 'A revision’s wheel file',
			access: 'read',
			answer: file('The file; its name carries the revision.', wheelFiles.dxf, wheelFiles.svg, wheelFiles.pdf, wheelFiles.stl),
			also: [{ status: 422, description: 'The revision no longer passes the wheel checks (a range was tightened since).' }]
		}
	},
	'/designs/{designId}/compare': {
		GET: {
			tag: 'Designs',
			summary: 'What changed between two revisions',
			access: 'read',
			query: compareQuery,
			answer: json('Each change with its label and values in words.', { a: 'object', b: 'object', changes: 'array' })
		}
	},
	'/designs/{designId}/restore': {
		POST: {
			tag: 'Designs',
			summary: 'Save an old revision again as the newest',
			access: 'edit',
			body: { json: restoreRevision },
			answer: json('Saved.', { revision: 'integer' }, 201),
			also: [stale],
			example: { body: { revision: 1, baseRevision: 2 } }
		}
	},
	'/openapi.json': {
		GET: {
			tag: 'Document',
			summary: 'This OpenAPI 3.1 document',
			answer: json('The document.', { openapi: 'string', info: 'object', servers: 'array', paths: 'object', components: 'object' })
		}
	}
};
