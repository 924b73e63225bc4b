import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { Card } from '../../../src/lib/server/db/models/index';
import { createAssignment } from '../../../src/lib/server/classes/assignments';
import { createClass } from '../../../src/lib/server/classes/classes';
import { joinByCode } from '../../../src/lib/server/classes/members';
import * as classesRoute from '../../../src/routes/api/classes/+server';
import * as classRoute from '../../../src/routes/api/classes/[id]/+server';
import * as joinRoute from '../../../src/routes/api/classes/join/+server';
import * as membersRoute from '../../../src/routes/api/classes/[id]/members/+server';
import * as memberRoute from '../../../src/routes/api/classes/[id]/members/[userId]/+server';
import * as invitationsRoute from '../../../src/routes/api/classes/[id]/invitations/+server';
import * as assignmentsRoute from '../../../src/routes/api/classes/[id]/assignments/+server';
import * as assignmentRoute from '../../../src/routes/api/assignments/[id]/+server';
import * as progressRoute from '../../../src/routes/api/classes/[id]/progress/+server';
import * as learnerRoute from '../../../src/routes/api/classes/[id]/learners/[userId]/+server';
import * as commentsRoute from '../../../src/routes/api/cards/[id]/comments/+server';
import { openTestWorld, type TestWorld } from '../support/world';
import { callAs, makeDeck, makeUser } from './world';

/**
 * Who may do what on every class endpoint. Each row names a route, the person asking and the
 * answer: another teacher's class is 404 (never a hint that it exists), a learner reaches only
 * classes they belong to and never the teacher's views, and nobody unsigned gets anything.
 */

let world: TestWorld;
type U = Awaited<ReturnType<typeof makeUser>>;
let teacher: U, otherTeacher: U, learner: U, classmate: U, outsider: U;
let classId: string, otherClassId: string, assignmentId: string, cardId: string, code: string;
let otherDeckId: string, deckId: string;

beforeAll(async () => {
	world = await openTestWorld();
	teacher = await makeUser('teacher', 'Rosa Owner');
	otherTeacher = await makeUser('teacher', 'Olga Other');
	learner = await makeUser('learner', 'Lena Member');
	classmate = await makeUser('learner', 'Carl Classmate');
	outsider = await makeUser('learner', 'Otto Outside');
	const created = await createClass(teacher, { name: 'Tuesday combo' });
	if (!created.ok) throw new Error(created.message);
	classId = created.class.id;
	code = created.class.code!;
	const other = await createClass(otherTeacher, { name: 'Other studio' });
	if (!other.ok) throw new Error(other.message);
	otherClassId = other.class.id;
	deckId = (await makeDeck(teacher.id)).deck.id;
	otherDeckId = (await makeDeck(otherTeacher.id, 2, 'Other deck')).deck.id;
	for (const person of [learner, classmate]) await joinByCode(person, code);
	// The learner is also in the other teacher's class: being their student there gives that
	// teacher nothing in this one.
	await joinByCode(learner, (other.ok && other.class.code) || '');
	const assigned = await createAssignment(teacher, classId, {
		deckId,
		startDate: '2026-03-02',
		newPerDay: 4
	});
	if (!assigned.ok) throw new Error(assigned.message);
	assignmentId = assigned.assignment.id;
	cardId = (await Card.findOne({ where: { userId: learner.id, assignmentId } }))!.id;
});
afterAll(() => world.close());

const json = (body: unknown) => ({ method: 'POST', body });

type Who = 'anonymous' | 'teacher' | 'otherTeacher' | 'learner' | 'classmate' | 'outsider';
const person = (who: Who) =>
	({ anonymous: null, teacher, otherTeacher, learner, classmate, outsider })[who];

interface Case {
	route: string;
	who: Who;
	status: number;
	run: (user: U | null) => Promise<Response>;
}

const cases: Case[] = [];
function each(route: string, run: Case['run'], expected: Partial<Record<Who, number>>) {
	for (const [who, status] of Object.entries(expected)) {
		cases.push({ route, who: who as Who, status: status!, run });
	}
}

each('GET /api/classes/[id]', (u) => callAs(classRoute.GET, u, { id: classId }), {
	anonymous: 401,
	otherTeacher: 404,
	outsider: 404,
	learner: 200,
	teacher: 200
});
each(
	'PUT /api/classes/[id]',
	(u) =>
		callAs(classRoute.PUT, u, { id: classId }, { method: 'PUT', body: { name: 'Renamed combo' } }),
	{ anonymous: 401, otherTeacher: 404, learner: 404, teacher: 200 }
);
each('DELETE /api/classes/[id]', (u) => callAs(classRoute.DELETE, u, { id: classId }), {
	anonymous: 401,
	otherTeacher: 404,
	learner: 404
});
each('POST /api/classes', (u) => callAs(classesRoute.POST, u, {}, json({ name: 'Mine' })), {
	anonymous: 401,
	learner: 403,
	teacher: 201
});
each('GET /api/classes/[id]/members', (u) => callAs(membersRoute.GET, u, { id: classId }), {
	anonymous: 401,
	otherTeacher: 404,
	learner: 404,
	teacher: 200
});
each(
	'DELETE /api/classes/[id]/members/[userId] (someone else)',
	(u) => callAs(memberRoute.DELETE, u, { id: classId, userId: classmate.id }),
	{ anonymous: 401, otherTeacher: 404, learner: 404, outsider: 404 }
);
each(
	'POST /api/classes/[id]/invitations',
	(u) => callAs(invitationsRoute.POST, u, { id: classId }, json({ email: 'new@example.test' })),
	{ anonymous: 401, otherTeacher: 404, learner: 404, teacher: 201 }
);
each('GET /api/classes/[id]/invitations', (u) => callAs(invitationsRoute.GET, u, { id: classId }), {
	anonymous: 401,
	otherTeacher: 404,
	learner: 404,
	teacher: 200
});
each('GET /api/classes/[id]/assignments', (u) => callAs(assignmentsRoute.GET, u, { id: classId }), {
	anonymous: 401,
	otherTeacher: 404,
	outsider: 404,
	learner: 200,
	teacher: 200
});
each(
	'POST /api/classes/[id]/assignments',
	(u) =>
		callAs(
			assignmentsRoute.POST,
			u,
			{ id: classId },
			json({ deckId, startDate: '2026-03-02', newPerDay: 2 })
		),
	{ anonymous: 401, otherTeacher: 404, learner: 404, teacher: 201 }
);
each(
	"POST /api/classes/[id]/assignments with another teacher's deck",
	(u) =>
		callAs(
			assignmentsRoute.POST,
			u,
			{ id: classId },
			json({ deckId: otherDeckId, startDate: '2026-03-02', newPerDay: 2 })
		),
	{ teacher: 422 }
);
each(
	'PUT /api/assignments/[id]',
	(u) =>
		callAs(assignmentRoute.PUT, u, { id: assignmentId }, { method: 'PUT', body: { newPerDay: 3 } }),
	{ anonymous: 401, otherTeacher: 404, learner: 404, teacher: 200 }
);
each(
	'DELETE /api/assignments/[id]',
	(u) => callAs(assignmentRoute.DELETE, u, { id: assignmentId }),
	{
		anonymous: 401,
		otherTeacher: 404,
		learner: 404
	}
);
each('GET /api/classes/[id]/progress', (u) => callAs(progressRoute.GET, u, { id: classId }), {
	anonymous: 401,
	otherTeacher: 404,
	learner: 404,
	teacher: 200
});
each(
	'GET /api/classes/[id]/progress?format=csv',
	(u) => callAs(progressRoute.GET, u, { id: classId }, { path: '/?format=csv' }),
	{ otherTeacher: 404, learner: 404, teacher: 200 }
);
each(
	'GET /api/classes/[id]/learners/[userId]',
	(u) => callAs(learnerRoute.GET, u, { id: classId, userId: learner.id }),
	{ anonymous: 401, otherTeacher: 404, learner: 404, classmate: 404, teacher: 200 }
);
each(
	'GET /api/classes/[id]/learners/[userId] of someone outside the class',
	(u) => callAs(learnerRoute.GET, u, { id: classId, userId: outsider.id }),
	{ teacher: 404 }
);
each('GET /api/cards/[id]/comments', (u) => callAs(commentsRoute.GET, u, { id: cardId }), {
	anonymous: 401,
	otherTeacher: 404,
	classmate: 404,
	outsider: 404,
	learner: 200,
	teacher: 200
});
each(
	'POST /api/cards/[id]/comments',
	(u) => callAs(commentsRoute.POST, u, { id: cardId }, json({ text: 'Try it slower in B.' })),
	{ anonymous: 401, otherTeacher: 404, classmate: 404, outsider: 404, learner: 201, teacher: 201 }
);
each('POST /api/classes/join', (u) => callAs(joinRoute.POST, u, {}, json({ code })), {
	anonymous: 401
});

describe('who may use each class endpoint', () => {
	test.each(cases.map((c) => [c.route, c.who, c.status, c] as const))(
		'%s as %s answers %i',
		async (_route, who, status, c) => {
			const res = await c.run(person(who));
			expect(res.status, await res.clone().text()).toBe(status);
		}
	);
});

describe('what each person sees', () => {
	test("a learner's class list holds their classes without a code or link, and no one else's", async () => {
		const res = await callAs(classesRoute.GET, outsider, {});
		expect((await res.json()).total).toBe(0);
		const mine = await (await callAs(classesRoute.GET, learner, {})).json();
		expect(mine.items.map((c: { id: string }) => c.id).sort()).toEqual(
			[classId, otherClassId].sort()
		);
		expect(
			mine.items.every((c: { code: unknown; link: unknown }) => c.code === null && c.link === null)
		).toBe(true);
	});

	test('a teacher lists only the classes they teach', async () => {
		const body = await (await callAs(classesRoute.GET, otherTeacher, {})).json();
		expect(body.items.map((c: { id: string }) => c.id)).toEqual([otherClassId]);
	});

	test('a learner leaves by removing themselves, and only themselves', async () => {
		const mate = await makeUser('learner', 'Leaving Soon');
		await joinByCode(mate, code);
		const res = await callAs(memberRoute.DELETE, mate, { id: classId, userId: mate.id });
		expect(res.status).toBe(200);
		const again = await callAs(memberRoute.DELETE, mate, { id: classId, userId: mate.id });
		expect(again.status).toBe(404);
	});

	test('malformed bodies and ids are refused without a 500', async () => {
		const answers = await Promise.all([
			callAs(classesRoute.POST, teacher, {}, json({ name: '' })),
			callAs(classesRoute.POST, teacher, {}, { method: 'POST', body: 'not json' }),
			callAs(classesRoute.POST, teacher, {}, { method: 'POST', body: '[]' }),
			callAs(classRoute.GET, teacher, { id: 'not-a-uuid' }),
			callAs(
				classRoute.PUT,
				teacher,
				{ id: classId },
				{ method: 'PUT', body: { joinCode: 'sideways' } }
			),
			callAs(joinRoute.POST, learner, {}, json({ code: 42 })),
			callAs(joinRoute.POST, learner, {}, json({ code: 'ZZZZZZZZ' })),
			callAs(
				assignmentsRoute.POST,
				teacher,
				{ id: classId },
				json({ deckId, startDate: '2026-02-30', newPerDay: 4 })
			),
			callAs(
				assignmentsRoute.POST,
				teacher,
				{ id: classId },
				json({ deckId, startDate: '2026-03-01', newPerDay: 4, keys: ['H'] })
			),
			callAs(
				assignmentsRoute.POST,
				teacher,
				{ id: classId },
				json({ deckId, startDate: '2026-03-01', newPerDay: 0 })
			),
			callAs(progressRoute.GET, teacher, { id: classId }, { path: '/?sort=shoe-size' }),
			callAs(progressRoute.GET, teacher, { id: classId }, { path: '/?format=xml' }),
			callAs(commentsRoute.POST, learner, { id: cardId }, json({ text: '   ' })),
			callAs(invitationsRoute.POST, teacher, { id: classId }, json({ email: 'not an address' }))
		]);
		expect(answers.map((r) => r.status)).toEqual([
			422, 400, 400, 404, 422, 422, 404, 422, 422, 422, 422, 400, 422, 422
		]);
	});

	test('a created class answers as the class itself: {id, name, code, …}', async () => {
		const created = await callAs(classesRoute.POST, teacher, {}, json({ name: 'Shape check' }));
		expect(created.status).toBe(201);
		const body = await created.json();
		expect(body).toMatchObject({ id: expect.any(String), name: 'Shape check' });
		expect(body.code).toMatch(/^[A-Z0-9]{4,16}$/);
		const read = await callAs(classRoute.GET, teacher, { id: body.id });
		expect(await read.json()).toEqual(body);
	});
});
