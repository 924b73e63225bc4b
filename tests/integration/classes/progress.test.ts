import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { classProgress } from '../../../src/lib/server/classes/progress';
import { learnerDetail, cellLevel } from '../../../src/lib/server/classes/learner';
import * as progressRoute from '../../../src/routes/api/classes/[id]/progress/+server';
import { openTestWorld, type TestWorld } from '../support/world';
import { buildScenario, comparable, expectedRows, SCENARIO_NOW } from './scenario';
import { callAs } from './world';

let world: TestWorld;
let scenario: Awaited<ReturnType<typeof buildScenario>>;
beforeAll(async () => {
	world = await openTestWorld();
	scenario = await buildScenario();
});
afterAll(() => world.close());

describe('class progress', () => {
	test('one row a learner, every figure counted from the review log of the class decks only', async () => {
		const result = await classProgress(scenario.teacher, scenario.classId, {}, SCENARIO_NOW);
		if (!result.ok) throw new Error(result.message);
		expect(comparable(result.items)).toEqual(expectedRows);
	});

	test('sorts by any column, missing values last, and filters by assignment', async () => {
		const byStreak = await classProgress(
			scenario.teacher,
			scenario.classId,
			{ sort: 'retention', dir: 'asc' },
			SCENARIO_NOW
		);
		expect(byStreak.ok && byStreak.items.map((r) => r.name)).toEqual([
			'Ada Steady',
			'Ben Patchy',
			'Cy Quiet'
		]);
		const desc = await classProgress(
			scenario.teacher,
			scenario.classId,
			{ sort: 'retention', dir: 'desc' },
			SCENARIO_NOW
		);
		expect(desc.ok && desc.items.map((r) => r.name)).toEqual([
			'Ben Patchy',
			'Ada Steady',
			'Cy Quiet'
		]);
		const spare = await classProgress(
			scenario.teacher,
			scenario.classId,
			{ assignmentId: scenario.otherId },
			SCENARIO_NOW
		);
		expect(spare.ok && spare.items.map((r) => r.reviewsThisWeek + r.doneToday + r.streak)).toEqual([
			0, 0, 0
		]);
		const wrong = await classProgress(
			scenario.teacher,
			scenario.classId,
			{ assignmentId: scenario.classId },
			SCENARIO_NOW
		);
		expect(wrong.ok ? 'accepted' : wrong.reason).toBe('invalid');
	});

	test('the CSV export streams the same rows with a header', async () => {
		const res = await callAs(
			progressRoute.GET,
			scenario.teacher,
			{ id: scenario.classId },
			{ path: '/?format=csv&sort=name' }
		);
		expect(res.headers.get('content-type')).toBe('text/csv; charset=utf-8');
		const lines = (await res.text()).trim().split('\n');
		expect(lines[0]).toBe(
			'learner,last practice (UTC),done today,due now,streak (days),retention (30 days),reviews this week,minutes this week,weakest keys,tempo reached (share of target)'
		);
		expect(lines).toHaveLength(4);
		expect(lines[3]).toBe('Cy Quiet,,0,0,0,,0,0,,');
	});
});

describe('a learner seen by their teacher', () => {
	test('the heat map has a row a lick and twelve key columns; each cell tells recall and tempo in words too', async () => {
		const result = await learnerDetail(scenario.teacher, scenario.classId, scenario.ada.id);
		if (!result.ok) throw new Error(result.message);
		const { view } = result;
		expect(view.keys).toEqual(['C', 'Db', 'D', 'Eb', 'E', 'F', 'Gb', 'G', 'Ab', 'A', 'Bb', 'B']);
		expect(view.rows.map((r) => r.title)).toEqual(['Lick 1', 'Lick 2', 'Spare lick 1']);
		const cell = (row: number, key: string) => view.rows[row].cells.find((c) => c.key === key)!;
		expect(cell(0, 'C')).toEqual({ key: 'C', reviews: 10, recall: 1, tempo: 100, level: 'secure' });
		expect(cell(1, 'Gb')).toEqual({
			key: 'Gb',
			reviews: 10,
			recall: 0,
			tempo: null,
			level: 'slipping'
		});
		expect(cell(0, 'D').level).toBe('unplayed');
		expect(view.rows.map((r) => [r.tempo, r.targetTempo, r.introduced])).toEqual([
			[120, 100, true],
			[60, 100, true],
			[null, 120, false]
		]);
		expect(view.log[0]).toEqual({
			day: '2026-03-10',
			reviews: 2,
			recalled: 1,
			licks: 2,
			minutes: 1
		});
		expect(view.log).toHaveLength(10);
	});

	test.each([
		[null, 0, 'unplayed'],
		[0.5, 4, 'slipping'],
		[1, 2, 'settling'],
		[0.85, 3, 'secure'],
		[0.84, 10, 'settling']
	] as const)('a cell with recall %s over %i reviews reads %s', (recall, reviews, level) => {
		expect(cellLevel(recall, reviews)).toBe(level);
	});

	test('a learner whose key order is the cycle of fourths sees its columns in that order', async () => {
		const { ben } = scenario;
		const { User } = await import('../../../src/lib/server/db/models/index');
		const row = (await User.findByPk(ben.id))!;
		await row.update({ settings: { ...row.settings, keyOrder: 'fourths' } });
		const result = await learnerDetail(scenario.teacher, scenario.classId, ben.id);
		// Cycle of fourths, common practice: C F Bb Eb Ab Db Gb B E A D G.
		expect(result.ok && result.view.keys).toEqual([
			'C',
			'F',
			'Bb',
			'Eb',
			'Ab',
			'Db',
			'Gb',
			'B',
			'E',
			'A',
			'D',
			'G'
		]);
		expect(result.ok && result.view.rows[0].cells.find((c) => c.key === 'Gb')?.reviews).toBe(3);
	});
});
