// The demo scenario (DESIGN.md §8). Everything here is invented: the vessel, the ports, the people
// and the ridge, placed in open ocean. Numbers are plausible for the demo only, not measurements.
import { and, eq } from 'drizzle-orm';
import { hashPassword } from '../src/lib/server/auth';
import type { Db } from '../src/lib/server/db/client';
import * as t from '../src/lib/server/db/schema';
import type { LonLat } from '../src/lib/server/db/schema';
import * as clearances from '../src/lib/server/clearances';
import * as deadlines from '../src/lib/server/deadlines';
import * as publications from '../src/lib/server/publications';
import { newId } from '../src/lib/server/ids';
import * as uploads from '../src/lib/server/storage/uploads';
import * as timelines from '../src/lib/server/timeline';
import { operatingDays } from '../src/lib/engine/timeline';
import { lineAmounts, totalMinor } from '../src/lib/money';
import * as tracks from '../src/lib/server/tracks';
import { ridgeInputs } from '../src/lib/server/plancompute';
import { RidgeDepthModel } from '../src/lib/engine/profile';
import { readTrack } from '../src/lib/engine/formats/track';
import { writeMgd77t } from '../src/lib/engine/formats/mgd77t';
import { createHash } from 'node:crypto';

export const DEMO_PASSWORD = 'ridge-crest-2027';

export const DEMO_USERS = [
	{
		email: 'admin@example.org',
		name: 'Marit Holloway',
		role: 'admin',
		what: 'marine office (admin)'
	},
	{
		email: 'chief@example.org',
		name: 'Dr Tove Achterberg',
		role: 'member',
		what: 'chief scientist',
		canLeadCruises: true
	},
	{ email: 'participant@example.org', name: 'Rafael Quenby', role: 'member', what: 'participant' },
	{ email: 'agent@example.org', name: 'Sunniva Okoro', role: 'member', what: 'port agent' },
	{ email: 'master@example.org', name: 'Capt. Elric Vance', role: 'member', what: 'master' }
] as const;

const DAY = 86_400_000;
const HOUR = 3_600_000;

/** Seeds the demo once; returns false when the database already holds users. */
export async function seedDemo(db: Db): Promise<boolean> {
	if (db.select({ id: t.user.id }).from(t.user).limit(1).get()) return false;
	const passwordHash = await hashPassword(DEMO_PASSWORD);

	const ids = Object.fromEntries(DEMO_USERS.map((u) => [u.email, newId()]));
	const party = [
		'Asha Lindqvist',
		'Bram Ostrowski',
		'Carmen Delacroix-Ng',
		'Dmitri Fairweather',
		'Eilidh Marchetti',
		'Fumiko Adeyemi',
		'Gustav Thorne',
		'Hana Petrakis',
		'Ivo Blackwood',
		'Jorunn Castellanos',
		'Kofi Lindgren',
		'Leilani Brandt',
		'Mateus Haverford',
		'Nadia Sorensen',
		'Oskar Villanueva',
		'Priya Halvorsen',
		'Quentin Mbeki',
		'Rosalind Fjeld',
		'Soren Achebe',
		'Talia Winterbourne',
		'Ulrich Nakamura',
		'Vesna Kowalczyk',
		'Wendell Abara',
		'Yannick Osei'
	].map((name) => ({
		id: newId(),
		name,
		email: name.toLowerCase().replace(/[^a-z]+/g, '.') + '@example.org'
	}));

	const sail = Date.UTC(2027, 4, 3, 8, 0); // 3 May 2027 08:00 UTC
	const portCall = Date.UTC(2027, 4, 17, 6, 0);
	const home = Date.UTC(2027, 4, 30, 16, 0);

	db.transaction((tx) => {
		for (const u of DEMO_USERS)
			tx.insert(t.user)
				.values({
					id: ids[u.email],
					email: u.email,
					name: u.name,
					role: u.role,
					canLeadCruises: 'canLeadCruises' in u && u.canLeadCruises,
					passwordHash
				})
				.run();
		// party[0] leads the second demo cruise, so the marine office has let them lead cruises.
		for (const p of party)
			tx.insert(t.user)
				.values({
					id: p.id,
					email: p.email,
					name: p.name,
					canLeadCruises: p === party[0],
					passwordHash
				})
				.run();

		const vesselId = newId();
		tx.insert(t.vessel)
			.values({
				id: vesselId,
				name: 'RV Marram Tern',
				callSign: 'XWLT7',
				scienceBerths: 24,
				transitSpeedKn: 10.5,
				surveySpeedKn: 8,
				dayRateMinor: 3_850_000,
				currency: 'EUR',
				swathAngleDeg: 130,
				swathDepthFactor: 4,
				winchSpeedMPerMin: 60,
				enduranceDays: 40
			})
			.run();
		tx.insert(t.vessel)
			.values({
				id: newId(),
				name: 'RV Skerry Lark',
				callSign: 'XWLS2',
				scienceBerths: 12,
				transitSpeedKn: 10,
				surveySpeedKn: 7.5,
				dayRateMinor: 1_900_000,
				currency: 'EUR',
				swathAngleDeg: 120,
				swathDepthFactor: 3.5,
				winchSpeedMPerMin: 50,
				enduranceDays: 21
			})
			.run();

		const ardent = newId();
		const bellmoor = newId();
		tx.insert(t.port)
			.values([
				{
					id: ardent,
					name: 'Port Ardent',
					countryCode: 'XA',
					lon: -150.2,
					lat: -31.4,
					utcOffsetMinutes: -600
				},
				{
					id: bellmoor,
					name: 'Bellmoor Harbour',
					countryCode: 'XB',
					lon: -141.6,
					lat: -27.9,
					utcOffsetMinutes: -540
				}
			])
			.run();

		const cruiseId = newId();
		tx.insert(t.cruise)
			.values({
				id: cruiseId,
				code: 'MT27-03',
				title: 'Crustal thickness across the Sallow Ridge segments',
				status: 'planned',
				vesselId,
				departurePortId: ardent,
				returnPortId: ardent,
				departureAt: new Date(sail),
				returnAt: new Date(home),
				allocatedDays: 21,
				weatherMarginPct: 12,
				depthModel: 'stein-stein-1992',
				createdById: ids['chief@example.org']
			})
			.run();
		// A second, smaller cruise the demo chief does not run, to show role separation.
		const otherCruise = newId();
		tx.insert(t.cruise)
			.values({
				id: otherCruise,
				code: 'SL27-01',
				title: 'Sediment cores on the outer flank',
				status: 'draft',
				allocatedDays: 9,
				createdById: ids['admin@example.org']
			})
			.run();
		tx.insert(t.cruiseMember)
			.values({ cruiseId: otherCruise, userId: party[0].id, role: 'chief_scientist' })
			.run();

		const roles: [string, t.CruiseRole][] = [
			[ids['chief@example.org'], 'chief_scientist'],
			[ids['participant@example.org'], 'participant'],
			[ids['agent@example.org'], 'port_agent'],
			[ids['master@example.org'], 'master'],
			// party[0] runs the other cruise and holds no role on this one.
			...party.slice(1).map((p) => [p.id, 'participant'] as [string, t.CruiseRole])
		];
		for (const [userId, role] of roles)
			tx.insert(t.cruiseMember).values({ cruiseId, userId, role }).run();

		const leg1 = newId();
		const leg2 = newId();
		tx.insert(t.leg)
			.values([
				{
					id: leg1,
					cruiseId,
					seq: 1,
					name: 'Leg 1 — northern segment',
					fromPortId: ardent,
					toPortId: bellmoor,
					startAt: new Date(sail),
					endAt: new Date(portCall)
				},
				{
					id: leg2,
					cruiseId,
					seq: 2,
					name: 'Leg 2 — southern segment and flanks',
					fromPortId: bellmoor,
					toPortId: ardent,
					startAt: new Date(portCall + 1.5 * DAY),
					endAt: new Date(home)
				}
			])
			.run();

		// The ridge: two spreading segments offset ~35 km by a transform fault near 30.5°S.
		const north: LonLat[] = [
			[-146.05, -29.2],
			[-146.0, -29.7],
			[-145.93, -30.2],
			[-145.9, -30.45]
		];
		const south: LonLat[] = [
			[-145.5, -30.55],
			[-145.46, -31.0],
			[-145.4, -31.5],
			[-145.35, -31.95]
		];
		tx.insert(t.ridgeSegment)
			.values([
				{
					id: newId(),
					cruiseId,
					name: 'Sallow Ridge north',
					axis: north,
					fullRateMmYr: 38,
					asymmetry: 0.5,
					potentialTemperatureC: 1330
				},
				{
					id: newId(),
					cruiseId,
					name: 'Sallow Ridge south',
					axis: south,
					fullRateMmYr: 38,
					asymmetry: 0.55,
					potentialTemperatureC: 1350,
					axialDepthM: 2750
				}
			])
			.run();

		// Cross-axis multibeam lines over both segments, along-axis lines, and a magnetics line.
		const lines: {
			name: string;
			coords: LonLat[];
			purpose: (typeof t.LINE_PURPOSES)[number];
			speed: number;
		}[] = [];
		for (let i = 0; i < 5; i++) {
			const lat = -29.4 - i * 0.22;
			lines.push({
				name: `N-X${i + 1}`,
				coords: [
					[-146.75, lat],
					[-145.25, lat]
				],
				purpose: 'multibeam',
				speed: 8
			});
		}
		for (let i = 0; i < 4; i++) {
			const lat = -30.8 - i * 0.25;
			lines.push({
				name: `S-X${i + 1}`,
				coords: [
					[-146.2, lat],
					[-144.7, lat]
				],
				purpose: 'multibeam',
				speed: 8
			});
		}
		lines.push({
			name: 'N-AX',
			coords: [
				[-146.02, -29.25],
				[-145.95, -30.4]
			],
			purpose: 'multibeam',
			speed: 7
		});
		lines.push({
			name: 'S-AX',
			coords: [
				[-145.48, -30.6],
				[-145.37, -31.9]
			],
			purpose: 'multibeam',
			speed: 7
		});
		lines.push({
			name: 'MAG-1',
			coords: [
				[-147.5, -30.5],
				[-144.0, -30.5]
			],
			purpose: 'magnetics',
			speed: 10
		});
		for (const l of lines)
			tx.insert(t.surveyLine)
				.values({
					id: newId(),
					cruiseId,
					name: l.name,
					coords: l.coords,
					purpose: l.purpose,
					surveySpeedKn: l.speed,
					overlapPct: 30,
					ihoOrder: '2'
				})
				.run();

		tx.insert(t.surveyArea)
			.values({
				id: newId(),
				cruiseId,
				name: 'Transform box',
				// Rings are stored open: the first vertex is not repeated.
				ring: [
					[-146.1, -30.3],
					[-145.3, -30.3],
					[-145.3, -30.7],
					[-146.1, -30.7]
				],
				overlapPct: 30,
				surveySpeedKn: 8
			})
			.run();

		const stations: {
			name: string;
			kind: t.StationKind;
			lon: number;
			lat: number;
			params: Record<string, number | string>;
		}[] = [
			{
				name: 'CTD-01',
				kind: 'ctd',
				lon: -145.98,
				lat: -29.9,
				params: { bottleStops: 12, deckMin: 30 }
			},
			{
				name: 'CTD-02',
				kind: 'ctd',
				lon: -145.42,
				lat: -31.2,
				params: { bottleStops: 12, deckMin: 30 }
			},
			{
				name: 'CTD-03',
				kind: 'ctd',
				lon: -146.6,
				lat: -29.8,
				params: { bottleStops: 6, deckMin: 30 }
			},
			{ name: 'DR-01', kind: 'dredge', lon: -145.95, lat: -30.1, params: { bottomH: 1.5 } },
			{ name: 'DR-02', kind: 'dredge', lon: -145.7, lat: -30.5, params: { bottomH: 1.5 } },
			{ name: 'DR-03', kind: 'dredge', lon: -145.38, lat: -31.6, params: { bottomH: 1.5 } },
			{ name: 'GC-01', kind: 'core', lon: -146.7, lat: -30.9, params: { coreType: 'gravity' } },
			{ name: 'GC-02', kind: 'core', lon: -144.6, lat: -31.3, params: { coreType: 'gravity' } },
			{ name: 'DIVE-01', kind: 'dive', lon: -145.96, lat: -29.98, params: { blockH: 8 } },
			{ name: 'DIVE-02', kind: 'dive', lon: -145.44, lat: -31.05, params: { blockH: 8 } }
		];
		for (const s of stations)
			tx.insert(t.station)
				.values({ id: newId(), cruiseId, ...s })
				.run();

		// Science party: 24 berths; leg 1 has 22 confirmed and 2 waitlisted, leg 2 is filling up.
		const applicants = [ids['participant@example.org'], ...party.slice(1).map((p) => p.id)];
		applicants.forEach((userId, i) => {
			const status = i < 22 ? 'confirmed' : 'waitlisted';
			tx.insert(t.berthApplication)
				.values({
					id: newId(),
					cruiseId,
					legId: leg1,
					userId,
					status,
					decidedById: ids['chief@example.org'],
					decidedAt: new Date(sail - 60 * DAY)
				})
				.run();
			if (i < 15)
				tx.insert(t.berthApplication)
					.values({
						id: newId(),
						cruiseId,
						legId: leg2,
						userId,
						status: i < 12 ? 'confirmed' : 'applied'
					})
					.run();
		});

		const issued = new Date(sail - 45 * DAY);
		tx.insert(t.invoice)
			.values([
				{
					id: newId(),
					cruiseId,
					number: 'WL-2027-0001',
					kind: 'port_call_estimate',
					description: 'Port call Bellmoor Harbour — disbursement estimate',
					amountMinor: 1_420_000,
					currency: 'EUR',
					status: 'paid',
					issuedAt: issued,
					dueAt: new Date(issued.getTime() + 30 * DAY),
					paidAt: new Date(issued.getTime() + 9 * DAY)
				},
				{
					id: newId(),
					cruiseId,
					number: 'WL-2027-0002',
					kind: 'ship_time',
					description: 'Ship time, leg 1 — 15 operating days at EUR 38,500',
					amountMinor: 15 * 3_850_000,
					currency: 'EUR',
					status: 'issued',
					issuedAt: issued,
					dueAt: new Date(sail - 7 * DAY)
				},
				{
					id: newId(),
					cruiseId,
					number: null,
					kind: 'recharge',
					description: 'Science-party recharge: shipping of the dredge kit',
					amountMinor: 312_500,
					currency: 'EUR',
					status: 'draft'
				}
			])
			.run();

		tx.insert(t.clearance)
			.values({
				id: newId(),
				cruiseId,
				coastalState: 'Republic of Xandera (invented)',
				leadMonths: 6,
				status: 'submitted',
				submittedAt: new Date(sail - 200 * DAY),
				notes: 'Request lodged through the operator office.'
			})
			.run();

		const sentAt = new Date(sail - 40 * DAY);
		for (const email of [
			'chief@example.org',
			'participant@example.org',
			'agent@example.org',
			'master@example.org'
		])
			tx.insert(t.notice)
				.values({
					id: newId(),
					cruiseId,
					kind: 'schedule',
					toAddress: email,
					subject: 'MT27-03 schedule planned: sails 3 May 2027 08:00 UTC from Port Ardent',
					text: 'The cruise MT27-03 is planned. Sailing 2027-05-03 08:00 UTC from Port Ardent; port call at Bellmoor Harbour 2027-05-17; home 2027-05-30.',
					status: 'sent',
					attempts: 1,
					nextAttemptAt: sentAt,
					sentAt,
					createdAt: sentAt
				})
				.run();
	});
	seedSchedule(db, sail);
	seedPublication(db);
	seedTrack(db);
	seedScienceParty(db);
	return true;
}

/**
 * Schedule version 1, published two days ago and delivered, then a change since (the port call at
 * Bellmoor Harbour grew by six hours), so the preview shows a real change summary. The notice log
 * also shows a delivery that failed for good and one waiting for its next try.
 */
function seedPublication(db: Db) {
	const cruiseId = demoCruiseId(db)!;
	const chief = db.select().from(t.user).where(eq(t.user.email, 'chief@example.org')).get()!.id;
	const at = Date.now() - 2 * DAY;
	publications.publish(chief, cruiseId, at, db);
	db.update(t.notice)
		.set({ status: 'sent', attempts: 1, sentAt: new Date(at + 60_000), createdAt: new Date(at) })
		.where(and(eq(t.notice.cruiseId, cruiseId), eq(t.notice.status, 'queued')))
		.run();
	const failed = db
		.select()
		.from(t.notice)
		.where(and(eq(t.notice.cruiseId, cruiseId), eq(t.notice.toAddress, 'yannick.osei@example.org')))
		.get();
	if (failed)
		db.update(t.notice)
			.set({
				status: 'failed',
				attempts: 8,
				sentAt: null,
				lastError: '[permanent] 550 5.1.1 mailbox unavailable (demo)'
			})
			.where(eq(t.notice.id, failed.id))
			.run();
	const retry = db
		.select()
		.from(t.notice)
		.where(
			and(eq(t.notice.cruiseId, cruiseId), eq(t.notice.toAddress, 'wendell.abara@example.org'))
		)
		.get();
	if (retry)
		db.update(t.notice)
			.set({
				status: 'queued',
				attempts: 3,
				sentAt: null,
				nextAttemptAt: new Date(Date.now() + 6 * HOUR),
				lastError: '421 4.4.2 connection timed out (demo)'
			})
			.where(eq(t.notice.id, retry.id))
			.run();
	const call = db
		.select()
		.from(t.planItem)
		.where(and(eq(t.planItem.cruiseId, cruiseId), eq(t.planItem.kind, 'port_call')))
		.get()!;
	timelines.setPortCallHours(chief, cruiseId, call.id, (call.portCallHours ?? 36) + 6, db);
}

/**
 * An invented earlier crossing of the northern segment, east–west along 29.8°S, one fix a minute
 * at 10 kn: the cruise's own model plus 180 m (a slightly thinner crust than assumed), a
 * 350 m-high seamount on the western flank and deterministic noise of ±60 m, written as MGD77T
 * and read back through the same reader as an upload.
 */
function seedTrack(db: Db) {
	const cruiseId = demoCruiseId(db)!;
	const chief = db.select().from(t.user).where(eq(t.user.email, 'chief@example.org')).get()!.id;
	const ridges = db
		.select()
		.from(t.ridgeSegment)
		.where(eq(t.ridgeSegment.cruiseId, cruiseId))
		.all();
	const c = db.select().from(t.cruise).where(eq(t.cruise.id, cruiseId)).get()!;
	const model = new RidgeDepthModel(ridgeInputs(ridges), { model: c.depthModel });
	const n = 800;
	const lon = new Float64Array(n);
	const lat = new Float64Array(n).fill(-29.8);
	const depthM = new Float64Array(n);
	const timeS = new Float64Array(n);
	const start = Date.UTC(2019, 4, 14, 6, 0) / 1000;
	let seed = 20190514;
	for (let i = 0; i < n; i++) {
		seed = (seed * 1664525 + 1013904223) >>> 0;
		const noise = (seed / 2 ** 32 - 0.5) * 120;
		// 10 kn for a minute is 308.7 m; along 29.8°S a degree of longitude is about 96.6 km
		lon[i] = -144.7 - (i * 0.3087) / 96.6;
		const seamount = -350 * Math.exp(-(((lon[i] + 146.9) / 0.05) ** 2));
		depthM[i] =
			Math.round((model.depthAt(lon[i], lat[i]).depthM + 180 + seamount + noise) * 10) / 10;
		timeS[i] = start + i * 60;
	}
	const text = writeMgd77t('WL190514', { lon, lat, depthM, timeS });
	tracks.create(
		chief,
		cruiseId,
		{
			name: 'Earlier crossing, May 2019',
			read: readTrack(text, { format: 'mgd77t' }),
			sha256: createHash('sha256').update(text).digest('hex')
		},
		db
	);
}

/**
 * The order of work for MT27-03 (leg 1 on the northern segment, a port call at Bellmoor Harbour,
 * leg 2 on the southern segment and flanks), the ship's clock changes, the clearance's plan items
 * and its frozen submission, and the checklist. Sized to fit the 28 allocated days.
 */
function seedSchedule(db: Db, sail: number) {
	const cruiseId = demoCruiseId(db)!;
	const chief = db.select().from(t.user).where(eq(t.user.email, 'chief@example.org')).get()!.id;
	const byName = new Map<string, { kind: 'line' | 'station'; refId: string }>([
		...db
			.select()
			.from(t.surveyLine)
			.where(eq(t.surveyLine.cruiseId, cruiseId))
			.all()
			.map((l) => [l.name, { kind: 'line' as const, refId: l.id }] as const),
		...db
			.select()
			.from(t.station)
			.where(eq(t.station.cruiseId, cruiseId))
			.all()
			.map((s) => [s.name, { kind: 'station' as const, refId: s.id }] as const)
	]);
	const bellmoor = db.select().from(t.port).where(eq(t.port.name, 'Bellmoor Harbour')).get()!.id;
	const leg1 = [
		'MAG-1',
		'CTD-03',
		'N-X1',
		'N-X2',
		'N-X3',
		'N-X4',
		'N-X5',
		'N-AX',
		'CTD-01',
		'DIVE-01',
		'DR-01'
	];
	const leg2 = [
		'DR-02',
		'S-X1',
		'S-X2',
		'S-X3',
		'S-X4',
		'S-AX',
		'DIVE-02',
		'CTD-02',
		'DR-03',
		'GC-02',
		'GC-01'
	];
	// Lines alternate direction so that each starts near where the last one ended.
	const reversed = new Set(['N-X2', 'N-X4', 'S-X2', 'S-X4', 'S-AX']);
	const ids = new Map<string, string>();
	for (const name of leg1) ids.set(name, timelines.addItem(chief, cruiseId, byName.get(name)!, db));
	timelines.addItem(chief, cruiseId, { kind: 'port_call', portId: bellmoor, hours: 36 }, db);
	for (const name of leg2) ids.set(name, timelines.addItem(chief, cruiseId, byName.get(name)!, db));
	const order = timelines.load(cruiseId, db).order;
	timelines.setOrder(
		chief,
		cruiseId,
		order.map((o) => ({ id: o.id, reversed: reversed.has(o.name) })),
		db
	);
	timelines.saveSettings(
		chief,
		cruiseId,
		{
			turnH: 0.75,
			mobilisationH: 48,
			demobilisationH: 24,
			marginMode: 'pct',
			weatherMarginPct: 12,
			weatherMarginDays: 0
		},
		db
	);
	// Port Ardent keeps UTC−10, Bellmoor Harbour UTC−9: the ship follows on the way there and back.
	const first = timelines.build(cruiseId, db).timeline!;
	const call = first.events.find((e) => e.kind === 'port')!;
	timelines.addClockChange(
		chief,
		cruiseId,
		{
			at: new Date(call.start - 12 * HOUR),
			utcOffsetMinutes: -540,
			note: 'To Bellmoor Harbour time'
		},
		db
	);
	timelines.addClockChange(
		chief,
		cruiseId,
		{
			at: new Date(call.end + 12 * HOUR),
			utcOffsetMinutes: -600,
			note: 'Back to Port Ardent time'
		},
		db
	);
	// The cruise form's dates are the allocated window: the allocated days from sailing. The legs
	// follow the planned timeline.
	const built = timelines.build(cruiseId, db);
	const legs = timelines.legSpans(built.timeline!, built.data);
	db.update(t.cruise)
		.set({
			returnAt: new Date(built.data.input!.departure.at + built.data.cruise.allocatedDays * DAY)
		})
		.where(eq(t.cruise.id, cruiseId))
		.run();
	for (const l of legs)
		db.update(t.leg)
			.set({ startAt: new Date(l.start), endAt: new Date(l.end) })
			.where(and(eq(t.leg.cruiseId, cruiseId), eq(t.leg.seq, l.seq)))
			.run();
	// Leg 1's ship-time invoice is billed on the operating days the timeline gives it.
	const leg1Days = operatingDays(legs[0].start, legs[0].end);
	db.update(t.invoice)
		.set({
			description: `Ship time, leg 1 — ${leg1Days} operating days at EUR 38,500`,
			amountMinor: leg1Days * 3_850_000
		})
		.where(eq(t.invoice.number, 'WL-2027-0002'))
		.run();
	seedInvoices(
		db,
		cruiseId,
		legs[0],
		leg1Days,
		db.select().from(t.user).where(eq(t.user.email, 'agent@example.org')).get()!.id
	);

	// The western flank work lies in Xandera's waters (invented boundary).
	const xandera = db.select().from(t.clearance).where(eq(t.clearance.cruiseId, cruiseId)).get()!;
	clearances.update(
		chief,
		cruiseId,
		xandera.id,
		{
			coastalState: xandera.coastalState,
			leadMonths: xandera.leadMonths,
			status: 'preparing',
			notes: xandera.notes ?? '',
			itemIds: ['MAG-1', 'CTD-03', 'GC-01'].map((n) => ids.get(n)!)
		},
		db
	);
	clearances.submit(chief, cruiseId, xandera.id, new Date(sail - 200 * DAY), db);

	deadlines.addUsual(chief, cruiseId, db);
	deadlines.create(
		chief,
		cruiseId,
		{
			title: 'Cruise plan to the operator’s office',
			kind: 'other',
			anchor: 'sailing',
			offsetDays: -180
		},
		db
	);
	for (const r of deadlines.rows(cruiseId, db))
		if (r.title.startsWith('Personnel forms') || r.title.startsWith('Dangerous goods'))
			deadlines.setDone(chief, cruiseId, r.id, true, db);
}

/** Invoice lines, payments and the other kinds and states (amounts invented for the demo). */
function seedInvoices(
	db: Db,
	cruiseId: string,
	leg1: { start: number; end: number; from: string; to: string },
	leg1Days: number,
	agentId: string
) {
	const line = (
		description: string,
		quantity: string,
		unitMinor: number,
		taxPct = '0',
		extra: Partial<t.InvoiceLine> = {}
	): t.InvoiceLine => ({
		description,
		quantity,
		unit: '',
		unitMinor,
		taxPct,
		...lineAmounts({ quantity, unitMinor, taxPct }),
		...extra
	});
	const byNumber = (n: string) => db.select().from(t.invoice).where(eq(t.invoice.number, n)).get()!;
	const billTo = 'Sallow Ridge project office\nInstitute of Ocean Floor Studies (invented)';
	const setLines = (id: string, lines: t.InvoiceLine[]) =>
		db
			.update(t.invoice)
			.set({ lines, amountMinor: totalMinor(lines), billTo })
			.where(eq(t.invoice.id, id))
			.run();

	// The paid port-call estimate, with its payment (and so its receipt).
	const estimate = byNumber('WL-2027-0001');
	const estimateLines = [
		line('Pilotage in and out', '2', 185_000, '25', { unit: 'act' }),
		line('Towage, two tugs', '4', 142_500, '25', { unit: 'tug-hour' }),
		line('Berth dues', '36', 9_800, '25', { unit: 'hour' }),
		line('Agency fee', '1', 175_000, '25'),
		line('Launch hire', '3', 21_000, '25', { unit: 'trip' }),
		line('Fresh water', '120', 450, '12', { unit: 'tonne' }),
		line('Waste reception', '1', 38_000, '25'),
		line('Customs and immigration clearance', '1', 26_500, '0')
	];
	setLines(estimate.id, estimateLines);
	const paidAt = estimate.paidAt ?? new Date();
	db.insert(t.payment)
		.values({
			id: newId(),
			invoiceId: estimate.id,
			checkoutSessionId: `cs_demo_${newId()}`,
			status: 'paid',
			amountMinor: totalMinor(estimateLines),
			currency: 'EUR',
			paidById: agentId,
			payerEmail: 'agent@example.org',
			paymentIntentId: `pi_demo_${newId()}`,
			completedAt: paidAt
		})
		.run();

	// Ship time for leg 1, issued and waiting for the port agent.
	const ship = byNumber('WL-2027-0002');
	setLines(ship.id, [
		line(`Leg 1: ${leg1.from} → ${leg1.to}`, String(leg1Days), 3_850_000, '0', {
			unit: 'operating day',
			legSeq: 1,
			start: leg1.start,
			end: leg1.end
		})
	]);

	// The science-party recharge draft.
	const draft = db
		.select()
		.from(t.invoice)
		.where(and(eq(t.invoice.cruiseId, cruiseId), eq(t.invoice.kind, 'recharge')))
		.get()!;
	setLines(draft.id, [line('Dredge kit freight, return', '1', 312_500, '0')]);

	const issued = estimate.issuedAt!;
	const due = new Date(issued.getTime() + 30 * DAY);
	const rows: (typeof t.invoice.$inferInsert)[] = [];
	const add = (
		v: Omit<typeof t.invoice.$inferInsert, 'id' | 'amountMinor' | 'cruiseId'> & {
			lines: t.InvoiceLine[];
			cruiseId?: string;
		}
	) => {
		const id = newId();
		rows.push({ id, cruiseId, billTo, amountMinor: totalMinor(v.lines), ...v });
		return id;
	};
	// Recharges per institution: berth-days × rate, partly paid.
	const partly = add({
		number: 'WL-2027-0003',
		kind: 'recharge',
		description: 'Science-party recharge, leg 1 — berth-days',
		currency: 'EUR',
		status: 'partly_paid',
		issuedAt: issued,
		dueAt: due,
		lines: [
			line('Berth-days, leg 1', '56', 24_000, '0', {
				unit: 'berth-day',
				institution: 'Harbourside University (invented)'
			}),
			line('Berth-days, leg 1', '42', 24_000, '0', {
				unit: 'berth-day',
				institution: 'Coldwater Institute (invented)'
			})
		]
	});
	// A recharge paid and then refunded in full (the trip was cancelled).
	const refunded = add({
		number: 'WL-2027-0004',
		kind: 'recharge',
		description: 'Science-party recharge — cancelled shore excursion',
		currency: 'EUR',
		status: 'refunded',
		issuedAt: issued,
		dueAt: due,
		lines: [line('Shore excursion, coach hire', '1', 64_000, '25')]
	});
	// The final account of the port call, still a draft: one line came in higher.
	add({
		number: null,
		kind: 'port_call_final',
		description: 'Port call Bellmoor Harbour — final account',
		currency: 'EUR',
		status: 'draft',
		estimateId: estimate.id,
		lines: estimateLines.map((l, i) =>
			i === 2
				? {
						...line(l.description, '41', 9_800, '25', { unit: 'hour' }),
						estimateMinor: l.amountMinor
					}
				: { ...l, estimateMinor: l.amountMinor }
		)
	});
	// A draft that was voided before issue.
	add({
		number: null,
		kind: 'port_call_estimate',
		description: 'Port call Bellmoor Harbour — first estimate (replaced)',
		currency: 'EUR',
		status: 'void',
		voidedAt: issued,
		lines: [line('Agency fee', '1', 150_000, '25')]
	});
	// A small zero-decimal invoice on the second cruise.
	const other = db.select().from(t.cruise).where(eq(t.cruise.code, 'SL27-01')).get()!;
	add({
		cruiseId: other.id,
		number: 'WL-2027-0005',
		kind: 'recharge',
		description: 'Core-splitting room, two days',
		currency: 'JPY',
		status: 'issued',
		issuedAt: issued,
		dueAt: due,
		lines: [line('Core-splitting room', '2', 24_000, '10', { unit: 'day' })]
	});
	db.insert(t.invoice).values(rows).run();
	const pay = (invoiceId: string, amountMinor: number, refundedMinor = 0) =>
		db
			.insert(t.payment)
			.values({
				id: newId(),
				invoiceId,
				checkoutSessionId: `cs_demo_${newId()}`,
				status: refundedMinor ? 'refunded' : 'paid',
				amountMinor,
				refundedMinor,
				refundedAt: refundedMinor ? new Date(issued.getTime() + 20 * DAY) : null,
				currency: 'EUR',
				paidById: agentId,
				payerEmail: 'agent@example.org',
				paymentIntentId: `pi_demo_${newId()}`,
				completedAt: new Date(issued.getTime() + 12 * DAY)
			})
			.run();
	pay(partly, 1_000_000);
	pay(refunded, 80_000, 80_000);
}

export function demoCruiseId(db: Db): string | undefined {
	return db.select({ id: t.cruise.id }).from(t.cruise).where(eq(t.cruise.code, 'MT27-03')).get()
		?.id;
}

/** A one-page PDF (ISO 32000-1 structure) standing in for a scanned form in the demo. */
function demoPdf(title: string): Uint8Array {
	const text = title.replace(/[()\\]/g, '');
	const stream = `BT /F1 14 Tf 40 150 Td (${text}) Tj ET`;
	const objs = [
		'<</Type/Catalog/Pages 2 0 R>>',
		'<</Type/Pages/Kids[3 0 R]/Count 1>>',
		'<</Type/Page/Parent 2 0 R/MediaBox[0 0 420 200]/Contents 4 0 R/Resources<</Font<</F1 5 0 R>>>>>>',
		`<</Length ${stream.length}>>stream\n${stream}\nendstream`,
		'<</Type/Font/Subtype/Type1/BaseFont/Helvetica>>'
	];
	let out = '%PDF-1.4\n';
	const offsets: number[] = [];
	objs.forEach((o, i) => {
		offsets.push(out.length);
		out += `${i + 1} 0 obj${o}endobj\n`;
	});
	const xref = out.length;
	out += `xref\n0 ${objs.length + 1}\n0000000000 65535 f \n`;
	for (const o of offsets) out += `${String(o).padStart(10, '0')} 00000 n \n`;
	out += `trailer<</Size ${objs.length + 1}/Root 1 0 R>>\nstartxref\n${xref}\n%%EOF\n`;
	return new TextEncoder().encode(out);
}

/**
 * The science party around the berth cap: leg 2 lowered to two free berths with six people waiting
 * in order, roles and institutions on every application, required documents in every state (one
 * expiring before the cruise returns, one medical), and travel details for the persons-on-board list.
 */
function seedScienceParty(db: Db) {
	const cruiseId = demoCruiseId(db)!;
	const id = (email: string) => db.select().from(t.user).where(eq(t.user.email, email)).get()!.id;
	const chief = id('chief@example.org');
	const me = id('participant@example.org');
	const legs = db.select().from(t.leg).where(eq(t.leg.cruiseId, cruiseId)).all();
	legs.sort((a, b) => a.seq - b.seq);
	const [leg1, leg2] = legs;
	const roles = [
		'scientist',
		'scientist',
		'technician',
		'student',
		'scientist',
		'observer'
	] as const;
	const institutes = [
		'Institute of Ocean Floors (invented)',
		'Saltmarsh University (invented)',
		'Northern Basin Survey (invented)'
	];
	const apps = db
		.select()
		.from(t.berthApplication)
		.where(eq(t.berthApplication.cruiseId, cruiseId))
		.all();
	apps.forEach((a, i) =>
		db
			.update(t.berthApplication)
			.set({ roleOnBoard: roles[i % roles.length], institution: institutes[i % institutes.length] })
			.where(eq(t.berthApplication.id, a.id))
			.run()
	);
	// Leg 1's two waiting people keep their order.
	apps
		.filter((a) => a.legId === leg1.id && a.status === 'waitlisted')
		.forEach((a, i) =>
			db
				.update(t.berthApplication)
				.set({ waitlistPosition: i + 1 })
				.where(eq(t.berthApplication.id, a.id))
				.run()
		);
	// The demo participant waits first in line for leg 2; five more wait behind them.
	db.update(t.berthApplication)
		.set({ status: 'waitlisted', waitlistPosition: 1, decidedById: chief })
		.where(and(eq(t.berthApplication.legId, leg2.id), eq(t.berthApplication.userId, me)))
		.run();
	const onLeg2 = new Set(apps.filter((a) => a.legId === leg2.id).map((a) => a.userId));
	const behind = apps
		.filter((a) => a.legId === leg1.id && !onLeg2.has(a.userId))
		.slice(0, 5)
		.map((a) => a.userId);
	behind.forEach((userId, i) =>
		db
			.insert(t.berthApplication)
			.values({
				id: newId(),
				cruiseId,
				legId: leg2.id,
				userId,
				status: 'waitlisted',
				waitlistPosition: i + 2,
				roleOnBoard: roles[(i + 2) % roles.length],
				institution: institutes[i % institutes.length],
				decidedById: chief
			})
			.run()
	);
	// Two cabins of leg 2 go to the ship's own technicians: two science berths stay free.
	const confirmed2 = db
		.select()
		.from(t.berthApplication)
		.where(and(eq(t.berthApplication.legId, leg2.id), eq(t.berthApplication.status, 'confirmed')))
		.all().length;
	db.update(t.leg)
		.set({ scienceBerths: confirmed2 + 2 })
		.where(eq(t.leg.id, leg2.id))
		.run();

	for (const [kind, daysBeforeSailing] of [
		['personnel', 60],
		['medical', 45],
		['passport', 30],
		['sea_survival', 30],
		['emergency_contact', 21]
	] as const)
		db.insert(t.documentRequirement).values({ cruiseId, kind, daysBeforeSailing }).run();

	const doc = (
		userId: string,
		kind: t.DocumentKind,
		filename: string,
		extra: Partial<t.Document> = {}
	) => {
		const bytes = demoPdf(`${kind} - demo document`);
		db.insert(t.document)
			.values({
				id: newId(),
				cruiseId,
				userId,
				kind,
				filename,
				mimeType: 'application/pdf',
				sizeBytes: bytes.byteLength,
				sha256: uploads.store(bytes),
				...extra
			})
			.run();
	};
	const reviewed = { reviewedById: chief, reviewedAt: new Date(Date.UTC(2027, 2, 20)) };
	doc(me, 'personnel', 'personnel-form-quenby.pdf', { status: 'accepted', ...reviewed });
	doc(me, 'medical', 'fitness-certificate.pdf', { expiresOn: '2028-03-01' });
	// Runs out on 20 May 2027, before the cruise is home (30 May).
	doc(me, 'passport', 'passport-page.pdf', { expiresOn: '2027-05-20' });
	doc(me, 'sea_survival', 'basic-safety.pdf', {
		status: 'rejected',
		reviewReason: 'The certificate page is cut off; upload the whole page, please.',
		expiresOn: '2029-01-31',
		...reviewed
	});
	const others = apps.filter((a) => a.legId === leg1.id && a.userId !== me).slice(0, 6);
	others.forEach((a, i) => {
		doc(
			a.userId,
			'personnel',
			`personnel-${i + 1}.pdf`,
			i < 4 ? { status: 'accepted', ...reviewed } : {}
		);
		if (i < 3) doc(a.userId, 'passport', `passport-${i + 1}.pdf`, { expiresOn: '2031-06-30' });
	});

	// Travel details for the persons-on-board list (invented nationalities and numbers).
	const nations = ['Xanderan', 'Bellmoorish', 'Ardentine'];
	const people = db
		.select({ userId: t.berthApplication.userId, name: t.user.name })
		.from(t.berthApplication)
		.innerJoin(t.user, eq(t.user.id, t.berthApplication.userId))
		.where(
			and(eq(t.berthApplication.cruiseId, cruiseId), eq(t.berthApplication.status, 'confirmed'))
		)
		.all();
	const seen = new Set<string>();
	people.forEach((p, i) => {
		// Two people have not entered theirs yet.
		if (seen.has(p.userId) || i >= people.length - 2) return;
		seen.add(p.userId);
		db.insert(t.travelProfile)
			.values({
				userId: p.userId,
				fullName: p.name.toUpperCase(),
				nationality: nations[i % nations.length],
				dateOfBirth: `19${70 + (i % 28)}-0${1 + (i % 9)}-1${i % 10}`,
				passportNumber: `XP${String(4810273 + i * 7919).padStart(7, '0')}`,
				passportExpiry: `203${i % 10}-11-30`
			})
			.run();
	});
}
