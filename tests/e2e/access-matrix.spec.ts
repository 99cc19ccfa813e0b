/**
 * Every page, form action and API route against every kind of visitor:
 * anonymous, the viewer, analyst and owner of workspace A (Halvard Marine
 * Energy), the owner of workspace B (Corvane Advisory), who must see nothing
 * of A, and two personal API tokens of A's analyst, read-only and
 * read-and-write. Tokens count on /api/v1 only: on pages they are nobody. One table row per route and method; the meta-test at the end
 * fails for any route under src/routes that has no row, so a new route costs
 * one line here.
 *
 * Writes are harmless: most send a bad body, so a permitted role gets 400/415/422
 * and a forbidden one 401/403/404 (the permission check must come first); the
 * few that change something act on a probe project made for this spec and are
 * undone by the row's `after`.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { join, relative, sep } from 'node:path';
import { expect, test, type APIRequestContext, type APIResponse, type request as playwrightRequest } from '@playwright/test';
import { baseURL, mailSinkHttpPort, stripeStandinPort } from '../../playwright.config';
import { demoUsers } from '../../seeds/02_demo_users';
import { METHOD_NOTES } from '../../src/lib/methods';
import { signedInGuestRequest, signedInRequest, workspaceIdOf, type Persona } from './helpers/session';
import { demoInvestor, secondInvestor } from '../../seeds/06_demo_room';

const sessionPersonas = ['anonymous', 'viewer', 'analyst', 'owner', 'outsider'] as const satisfies readonly Persona[];
const tokenPersonas = ['readToken', 'writeToken'] as const;
/** Invited investors (room guests) of room X (workspace A's demo room) and of room Y (workspace B's). */
const guestPersonas = ['investorX', 'investorY'] as const;
const personas = [...sessionPersonas, ...tokenPersonas, ...guestPersonas] as const;
type Caller = (typeof personas)[number];
type Role = 'viewer' | 'analyst' | 'owner';
const rank: Record<Role, number> = { viewer: 1, analyst: 2, owner: 3 };

const WORKSPACE_A = 'Halvard Marine Energy';
const WORKSPACE_B = 'Corvane Advisory';

/** A status, or `303 <prefix>`: a redirect whose location starts with the prefix. */
type Answer = number | `303 ${string}`;
/** Token answers may be left out for pages and form actions: there a token is nobody, so they answer as anonymous. */
type Answers = Record<(typeof sessionPersonas)[number], Answer> &
	Partial<Record<(typeof tokenPersonas)[number], Answer>> &
	Partial<Record<(typeof guestPersonas)[number], Answer>>;

const toSignIn: Answer = '303 /signin?next=';

/** Workbench pages inside workspace A: anonymous to sign-in, outsider 404, too low a role 403. */
function page(minimum: Role): Answers {
	const member = (role: Role): Answer => (rank[role] >= rank[minimum] ? 200 : 403);
	return { anonymous: toSignIn, viewer: member('viewer'), analyst: member('analyst'), owner: member('owner'), outsider: 404 };
}

/** A form action inside workspace A whose permitted answer is `allowed` (a bad body's 400, say). */
function action(minimum: Role, allowed: Answer): Answers {
	const member = (role: Role): Answer => (rank[role] >= rank[minimum] ? allowed : 403);
	return { anonymous: toSignIn, viewer: member('viewer'), analyst: member('analyst'), owner: member('owner'), outsider: 404 };
}

/**
 * API routes on workspace A's resources: anonymous 401, outsider 404, too low
 * a role 403. The analyst's read-only token acts as a viewer, the read-and-write
 * one as the analyst, never more.
 */
function api(minimum: Role, allowed: Answer = 200): Answers {
	const member = (role: Role): Answer => (rank[role] >= rank[minimum] ? allowed : 403);
	return {
		anonymous: 401,
		viewer: member('viewer'),
		analyst: member('analyst'),
		owner: member('owner'),
		outsider: 404,
		readToken: member('viewer'),
		writeToken: member('analyst')
	};
}

/** Needs only a signed-in user, of any workspace. */
function signedIn(allowed: Answer, anonymous: Answer = toSignIn): Answers {
	return { anonymous, viewer: allowed, analyst: allowed, owner: allowed, outsider: allowed };
}

function everyone(answer: Answer): Answers {
	return { anonymous: answer, viewer: answer, analyst: answer, owner: answer, outsider: answer, readToken: answer, writeToken: answer, investorX: answer, investorY: answer };
}

/** A /rooms page of room X: its investor gets `allowed`, the other room's investor 404, everyone else (never a guest) the guests' sign-in. */
function roomX(allowed: Answer): Answers {
	return { ...everyone('303 /rooms/signin?next='), investorX: allowed, investorY: 404 };
}

/** What each caller should get: token answers default to anonymous's on pages and actions. */
function expectedOf(row: Row): Record<Caller, Answer> {
	const isApi = row.route.startsWith('/api/');
	if (isApi && (row.expect.readToken === undefined || row.expect.writeToken === undefined)) {
		throw new Error(`${row.method} ${row.route}: an API row needs answers for both tokens`);
	}
	// Outside /rooms a room guest is nobody: anonymous's answer, unless the row says otherwise.
	return {
		...row.expect,
		readToken: row.expect.readToken ?? row.expect.anonymous,
		writeToken: row.expect.writeToken ?? row.expect.anonymous,
		investorX: row.expect.investorX ?? row.expect.anonymous,
		investorY: row.expect.investorY ?? row.expect.anonymous
	};
}

type Method = 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';
type Body = { json: unknown } | { form: Record<string, string> };

interface Ids {
	roomId: string;
	documentId: string;
	version: string;
	position: string;
	workspaceId: string;
	workspaceB: string;
	projectId: string;
	scenarioId: string;
	runId: string;
	uploadId: string;
	revision: string;
	slug: string;
	token: string;
}

interface Row {
	/** The route as its folder names it under src/routes, route groups left out. */
	route: string;
	method: Method;
	/** A form action's name (`default` for the default action). */
	action?: string;
	query?: string;
	body?: Body;
	expect: Answers;
	/** Undoes what a permitted persona changed; runs after each persona's request. */
	after?: (persona: Caller, response: APIResponse) => Promise<void>;
	/** The request ends the persona's session(s): sign in again afterwards. */
	endsSessions?: boolean;
	/** The request ends a room guest's session: sign in again afterwards. */
	endsGuestSessions?: boolean;
}

const badJson = { json: { notAField: true } };

const matrix: Row[] = [
	// Public pages
	{ route: '/', method: 'GET', expect: everyone(200) },
	{ route: '/signin', method: 'GET', expect: { ...signedIn('303 /app'), anonymous: 200 } },
	// A signed-in user's failed post re-renders the page, whose load sends them on to the workbench.
	{ route: '/signin', method: 'POST', action: 'default', body: { form: { email: '', password: '' } }, expect: { ...signedIn('303 /app'), anonymous: 400 } },
	{ route: '/signup', method: 'GET', expect: { ...signedIn('303 /app'), anonymous: 200 } },
	{ route: '/signup', method: 'POST', action: 'default', body: { form: { email: 'not-an-address' } }, expect: { ...signedIn('303 /app'), anonymous: 400 } },
	{ route: '/signout', method: 'GET', expect: everyone('303 /signin') },
	{ route: '/signout', method: 'POST', action: 'default', expect: everyone('303 /signin?notice=signed-out'), endsSessions: true },
	{ route: '/forgot-password', method: 'GET', expect: everyone(200) },
	{ route: '/forgot-password', method: 'POST', action: 'default', body: { form: { email: 'not-an-address' } }, expect: everyone(400) },
	{ route: '/reset-password/[token]', method: 'GET', expect: everyone(200) },
	{ route: '/reset-password/[token]', method: 'POST', action: 'default', body: { form: { password: '' } }, expect: everyone(400) },
	{ route: '/verify-email/[token]', method: 'GET', expect: everyone(200) },
	{ route: '/verify-email/[token]', method: 'POST', action: 'default', expect: everyone(400) },
	{ route: '/invite/[token]', method: 'GET', expect: everyone(200) },
	{ route: '/invite/[token]', method: 'POST', action: 'accept', expect: { ...signedIn(400), anonymous: '303 /signin?next=' } },
	{ route: '/invite/[token]', method: 'POST', action: 'join', body: { form: { name: '', password: '' } }, expect: everyone(400) },
	// Investors' side: their own sign-in and door; members and tokens are nobody under /rooms.
	{ route: '/rooms', method: 'GET', expect: { ...everyone('303 /rooms/signin?next='), investorX: 200, investorY: 200 } },
	{ route: '/rooms/signin', method: 'GET', expect: { ...everyone(200), investorX: '303 /rooms', investorY: '303 /rooms' } },
	// As with /signin: a signed-in guest's failed post re-renders the page, whose load sends them on to their rooms.
	{ route: '/rooms/signin', method: 'POST', action: 'password', body: { form: { email: 'not-an-address', password: '' } }, expect: { ...everyone(400), investorX: '303 /rooms', investorY: '303 /rooms' } },
	{ route: '/rooms/signin', method: 'POST', action: 'link', body: { form: { email: 'not-an-address' } }, expect: { ...everyone(400), investorX: '303 /rooms', investorY: '303 /rooms' } },
	{ route: '/rooms/signout', method: 'GET', expect: everyone('303 /rooms/signin') },
	{ route: '/rooms/signout', method: 'POST', action: 'default', expect: everyone('303 /rooms/signin'), endsGuestSessions: true },
	{ route: '/rooms/join/[token]', method: 'GET', expect: everyone(200) },
	{ route: '/rooms/join/[token]', method: 'POST', action: 'default', expect: everyone(400) },
	{ route: '/rooms/[roomId]', method: 'GET', expect: roomX(200) },
	{ route: '/rooms/[roomId]', method: 'POST', action: 'ask', body: { form: { question: '' } }, expect: roomX(400) },
	{ route: '/rooms/[roomId]/terms', method: 'GET', expect: roomX(200) },
	{ route: '/rooms/[roomId]/terms', method: 'POST', action: 'default', body: { form: { termsVersion: '0' } }, expect: roomX('303 /rooms/{roomId}') },
	{ route: '/rooms/[roomId]/scenarios/[position]', method: 'GET', expect: roomX(200) },
	{ route: '/rooms/[roomId]/scenarios/[position]/summary.pdf', method: 'GET', expect: roomX(200) },
	{ route: '/rooms/[roomId]/documents/[documentId]', method: 'GET', expect: roomX(200) },

	// Dev-only inbox: a local demo's (loopback, beside the mail sink the browser tests run), for signed-in users only.
	{ route: '/dev/mail', method: 'GET', expect: signedIn(200) },

	// Workbench pages
	{ route: '/app', method: 'GET', expect: signedIn('303 /app/w/') },
	// The outsider's refused switch re-renders /app, whose load sends them to their own workspace: nothing switched.
	{
		route: '/app',
		method: 'POST',
		action: 'switch',
		body: { form: { workspaceId: '{workspaceId}' } },
		expect: { ...signedIn('303 /app/w/{workspaceId}'), outsider: '303 /app/w/{workspaceB}' }
	},
	{ route: '/app/account', method: 'GET', expect: signedIn(200) },
	{ route: '/app/account', method: 'POST', action: 'rename', body: { form: { name: '' } }, expect: signedIn(400) },
	{ route: '/app/account', method: 'POST', action: 'password', body: { form: {} }, expect: signedIn(400) },
	{ route: '/app/account', method: 'POST', action: 'endSession', body: { form: { handle: 'zzzzzzzzzz' } }, expect: signedIn(404) },
	{ route: '/app/account', method: 'POST', action: 'signOutEverywhere', expect: signedIn('303 /signin?notice=signed-out-everywhere'), endsSessions: true },
	{ route: '/app/account', method: 'POST', action: 'resendVerification', expect: signedIn(200) },
	{ route: '/app/account', method: 'POST', action: 'createToken', body: { form: { name: '' } }, expect: signedIn(400) },
	{ route: '/app/account', method: 'POST', action: 'revokeToken', body: { form: { tokenId: 'nobody' } }, expect: signedIn(404) },
	{ route: '/app/methods', method: 'GET', expect: signedIn(200) },
	{ route: '/app/api', method: 'GET', expect: signedIn(200) },
	{ route: '/app/methods/[slug]', method: 'GET', expect: signedIn(200) },
	{ route: '/app/portfolio', method: 'GET', expect: signedIn(200) },
	{ route: '/app/w/[workspaceId]', method: 'GET', expect: page('viewer') },
	// An example project: an unknown technology answers 400 after the role check (a real one would make a project).
	{ route: '/app/w/[workspaceId]', method: 'POST', action: 'example', body: { form: { technology: 'steam' } }, expect: action('analyst', 400) },
	{ route: '/app/w/[workspaceId]/audit', method: 'GET', expect: page('owner') },
	{ route: '/app/w/[workspaceId]/members', method: 'GET', expect: page('viewer') },
	{ route: '/app/w/[workspaceId]/settings', method: 'GET', expect: page('viewer') },
	{ route: '/app/w/[workspaceId]/settings', method: 'POST', action: 'numberLocale', body: { form: { numberLocale: 'xx-YY' } }, expect: action('owner', 400) },
	// Billing is the owners' (workspace A pays for the Team plan in the demo data); bad fields answer 400 after the check.
	{ route: '/app/w/[workspaceId]/billing', method: 'GET', expect: page('owner') },
	{ route: '/app/w/[workspaceId]/billing', method: 'POST', action: 'upgrade', body: { form: { plan: 'gold', seats: 'many' } }, expect: action('owner', 400) },
	{ route: '/app/w/[workspaceId]/billing', method: 'POST', action: 'previewSeats', body: { form: { seats: '0' } }, expect: action('owner', 400) },
	{ route: '/app/w/[workspaceId]/billing', method: 'POST', action: 'changeSeats', body: { form: { seats: 'x' } }, expect: action('owner', 400) },
	{ route: '/app/w/[workspaceId]/billing', method: 'POST', action: 'cancel', expect: action('owner', 200), after: resumeBilling },
	{ route: '/app/w/[workspaceId]/billing', method: 'POST', action: 'resume', expect: action('owner', 200) },
	{ route: '/app/w/[workspaceId]/billing', method: 'POST', action: 'portal', expect: action('owner', `303 http://127.0.0.1:${stripeStandinPort}/portal/`) },
	{ route: '/app/w/[workspaceId]/portfolio', method: 'GET', expect: page('viewer') },
	{ route: '/app/w/[workspaceId]/projects/[projectId]', method: 'GET', expect: page('viewer') },
	// Renaming and a new currency are the analysts' (an empty currency is refused: 400); archiving and deleting an archived scenario the owners', and both ask first:
	// the owner's body-less archive gets the question (200) and nothing changes.
	{ route: '/app/w/[workspaceId]/projects/[projectId]', method: 'POST', action: 'rename', body: { form: { name: '' } }, expect: action('analyst', 400) },
	{ route: '/app/w/[workspaceId]/projects/[projectId]', method: 'POST', action: 'currency', body: { form: { currency: '' } }, expect: action('analyst', 400) },
	{ route: '/app/w/[workspaceId]/projects/[projectId]', method: 'POST', action: 'archive', expect: action('owner', 200) },
	{ route: '/app/w/[workspaceId]/projects/[projectId]', method: 'POST', action: 'deleteScenario', body: { form: { scenarioId: 'nobody' } }, expect: action('owner', 400) },
	{ route: '/app/w/[workspaceId]/projects/[projectId]/compare', method: 'GET', expect: page('viewer') },
	{ route: '/app/w/[workspaceId]/projects/[projectId]/scenarios/[scenarioId]', method: 'GET', expect: page('viewer') },
	{ route: '/app/w/[workspaceId]/projects/[projectId]/scenarios/[scenarioId]/sensitivity', method: 'GET', expect: page('viewer') },
	// The history reads like the scenario; restoring a revision saves, as the analysts' saves do.
	{ route: '/app/w/[workspaceId]/projects/[projectId]/scenarios/[scenarioId]/history', method: 'GET', expect: page('viewer') },
	{ route: '/app/w/[workspaceId]/projects/[projectId]/scenarios/[scenarioId]/history', method: 'POST', action: 'restore', body: { form: { revision: 'x' } }, expect: action('analyst', 400) },
	// Probabilistic runs (workspace A is on the Team plan): viewers read them, analysts start and cancel them from the API.
	{ route: '/app/w/[workspaceId]/projects/[projectId]/scenarios/[scenarioId]/runs', method: 'GET', expect: page('viewer') },
	{ route: '/app/w/[workspaceId]/runs', method: 'GET', expect: page('viewer') },
	{ route: '/app/w/[workspaceId]/members', method: 'POST', action: 'invite', body: { form: { email: 'not-an-address', role: 'analyst' } }, expect: action('owner', 400) },
	{ route: '/app/w/[workspaceId]/members', method: 'POST', action: 'changeRole', body: { form: { userId: 'nobody', role: 'boss' } }, expect: action('owner', 400) },
	{ route: '/app/w/[workspaceId]/members', method: 'POST', action: 'remove', body: { form: { userId: 'nobody' } }, expect: action('owner', 400) },
	{ route: '/app/w/[workspaceId]/members', method: 'POST', action: 'revoke', body: { form: { invitationId: 'nobody' } }, expect: action('owner', 404) },
	// Data rooms, the team's side (room X belongs to workspace A): viewers read, analysts and owners change.
	{ route: '/app/w/[workspaceId]/projects/[projectId]/rooms', method: 'GET', expect: page('viewer') },
	{ route: '/app/w/[workspaceId]/projects/[projectId]/rooms', method: 'POST', action: 'create', body: { form: { name: '' } }, expect: action('analyst', 400) },
	{ route: '/app/w/[workspaceId]/rooms/[roomId]', method: 'GET', expect: page('viewer') },
	{ route: '/app/w/[workspaceId]/rooms/[roomId]', method: 'POST', action: 'publish', expect: action('analyst', 400) },
	{ route: '/app/w/[workspaceId]/rooms/[roomId]', method: 'POST', action: 'upload', body: { form: { folder: 'x' } }, expect: action('analyst', 400) },
	{ route: '/app/w/[workspaceId]/rooms/[roomId]', method: 'POST', action: 'removeDocument', body: { form: { documentId: 'nobody' } }, expect: action('analyst', 404) },
	{ route: '/app/w/[workspaceId]/rooms/[roomId]', method: 'POST', action: 'invite', body: { form: { email: 'not-an-address' } }, expect: action('analyst', 400) },
	{ route: '/app/w/[workspaceId]/rooms/[roomId]', method: 'POST', action: 'revoke', body: { form: { guestId: 'nobody' } }, expect: action('analyst', 404) },
	{ route: '/app/w/[workspaceId]/rooms/[roomId]', method: 'POST', action: 'answer', body: { form: { questionId: 'nobody' } }, expect: action('analyst', 400) },
	{ route: '/app/w/[workspaceId]/rooms/[roomId]', method: 'POST', action: 'terms', body: { form: { terms: '' } }, expect: action('analyst', 400) },
	{ route: '/app/w/[workspaceId]/rooms/[roomId]/log', method: 'GET', expect: page('viewer') },
	{ route: '/app/w/[workspaceId]/rooms/[roomId]/log.csv', method: 'GET', expect: page('viewer') },
	{ route: '/app/w/[workspaceId]/rooms/[roomId]/documents/[documentId]', method: 'GET', expect: page('viewer') },
	{ route: '/app/w/[workspaceId]/rooms/[roomId]/versions/[version]', method: 'GET', expect: page('viewer') },
	{ route: '/app/w/[workspaceId]/rooms/[roomId]/versions/[version]/scenarios/[position]', method: 'GET', expect: page('viewer') },
	{ route: '/app/w/[workspaceId]/rooms/[roomId]/versions/[version]/scenarios/[position]/summary.pdf', method: 'GET', expect: page('viewer') },
	// Leaving works for viewer and analyst (and is undone by a fresh invitation); the one owner may not leave.
	{ route: '/app/w/[workspaceId]/members', method: 'POST', action: 'leave', expect: { ...action('viewer', '303 /app'), owner: 409 }, after: rejoinAfterLeaving },

	// API
	{ route: '/api/v1/health', method: 'GET', expect: everyone(200) },
	// Stripe's deliveries carry no session or token: without a valid signature everyone gets 400.
	{ route: '/api/v1/billing/webhook', method: 'POST', body: badJson, expect: everyone(400) },
	{ route: '/api/v1/openapi.json', method: 'GET', expect: everyone(200) },
	{ route: '/api/v1/workspaces', method: 'GET', expect: { ...signedIn(200, 401), readToken: 200, writeToken: 200 } },
	// The portfolio spans the caller's own workspaces (a token's: its own); a bad filter answers 422, but only after sign-in.
	{ route: '/api/v1/portfolio', method: 'GET', expect: { ...signedIn(200, 401), readToken: 200, writeToken: 200 } },
	{ route: '/api/v1/portfolio', method: 'GET', query: 'status=deleted', expect: { ...signedIn(422, 401), readToken: 422, writeToken: 422 } },
	{ route: '/api/v1/portfolio.csv', method: 'GET', expect: { ...signedIn(200, 401), readToken: 200, writeToken: 200 } },
	{ route: '/api/v1/workspaces/[workspaceId]/projects', method: 'GET', expect: api('viewer') },
	{ route: '/api/v1/workspaces/[workspaceId]/projects', method: 'POST', body: badJson, expect: api('analyst', 422) },
	{ route: '/api/v1/workspaces/[workspaceId]/runs', method: 'GET', expect: api('viewer') },
	{ route: '/api/v1/projects/[projectId]', method: 'GET', expect: api('viewer') },
	{ route: '/api/v1/projects/[projectId]', method: 'PATCH', body: badJson, expect: api('analyst', 422) },
	{ route: '/api/v1/projects/[projectId]', method: 'DELETE', expect: api('owner'), after: restoreProbeProject },
	{ route: '/api/v1/projects/[projectId]/compare', method: 'GET', query: 'ids=not-an-id', expect: api('viewer', 422) },
	{ route: '/api/v1/projects/[projectId]/restore', method: 'POST', expect: api('owner') },
	{ route: '/api/v1/projects/[projectId]/scenarios', method: 'GET', expect: api('viewer') },
	{ route: '/api/v1/projects/[projectId]/scenarios', method: 'POST', body: badJson, expect: api('analyst', 422) },
	{ route: '/api/v1/projects/[projectId]/uploads', method: 'GET', expect: api('viewer') },
	{ route: '/api/v1/projects/[projectId]/uploads', method: 'POST', body: badJson, expect: api('analyst', 415) },
	{ route: '/api/v1/scenarios/[scenarioId]', method: 'GET', expect: api('viewer') },
	{ route: '/api/v1/scenarios/[scenarioId]', method: 'PUT', body: badJson, expect: api('analyst', 422) },
	// Deleting for good needs an archived scenario: the live probe answers 409 to the owner.
	{ route: '/api/v1/scenarios/[scenarioId]', method: 'DELETE', expect: api('owner', 409) },
	{ route: '/api/v1/scenarios/[scenarioId]/archive', method: 'POST', expect: api('analyst'), after: restoreProbeScenario },
	{ route: '/api/v1/scenarios/[scenarioId]/base-case', method: 'POST', expect: api('analyst') },
	{ route: '/api/v1/scenarios/[scenarioId]/duplicate', method: 'POST', body: badJson, expect: api('analyst', 422) },
	{ route: '/api/v1/scenarios/[scenarioId]/evaluate', method: 'POST', body: badJson, expect: api('viewer', 422) },
	{ route: '/api/v1/scenarios/[scenarioId]/export', method: 'GET', query: 'format=not-a-format', expect: api('viewer', 422) },
	{ route: '/api/v1/scenarios/[scenarioId]/restore', method: 'POST', expect: api('analyst') },
	{ route: '/api/v1/scenarios/[scenarioId]/revisions', method: 'GET', expect: api('viewer') },
	{ route: '/api/v1/scenarios/[scenarioId]/revisions/[revision]', method: 'GET', expect: api('viewer') },
	{ route: '/api/v1/scenarios/[scenarioId]/spider', method: 'POST', body: badJson, expect: api('viewer', 422) },
	// The probe's run (made and finished in beforeAll): read by viewers; a bad start body is 422 after the role check;
	// cancelling the finished run is 409 for those allowed to cancel, after the role check.
	{ route: '/api/v1/scenarios/[scenarioId]/runs', method: 'GET', expect: api('viewer') },
	{ route: '/api/v1/scenarios/[scenarioId]/runs', method: 'POST', body: badJson, expect: api('analyst', 422) },
	{ route: '/api/v1/scenarios/[scenarioId]/runs/[runId]', method: 'GET', expect: api('viewer') },
	{ route: '/api/v1/scenarios/[scenarioId]/runs/[runId]/cancel', method: 'POST', expect: api('analyst', 409) },
	{ route: '/api/v1/scenarios/[scenarioId]/runs/[runId]/draws.csv', method: 'GET', expect: api('viewer') },
	{ route: '/api/v1/scenarios/[scenarioId]/summary.pdf', method: 'GET', expect: api('viewer') },
	{ route: '/api/v1/scenarios/[scenarioId]/tornado', method: 'POST', body: badJson, expect: api('viewer', 422) },
	{ route: '/api/v1/uploads/[uploadId]', method: 'GET', expect: api('viewer') },
	{ route: '/api/v1/uploads/[uploadId]/apply', method: 'POST', body: { json: { revision: 'not-a-number' } }, expect: api('analyst', 422) },
	{ route: '/api/v1/uploads/[uploadId]/file', method: 'GET', expect: api('viewer') }
];

const clients = {} as Record<Caller, APIRequestContext>;
const ids = {} as Ids;

let requestFactory: typeof playwrightRequest;

async function signIn(persona: Caller) {
	if (persona === 'readToken' || persona === 'writeToken') return;
	if (persona === 'investorX' || persona === 'investorY') {
		clients[persona] = await signedInGuestRequest({ request: requestFactory }, baseURL, persona === 'investorX' ? demoInvestor : secondInvestor);
		return;
	}
	clients[persona] = await signedInRequest({ request: requestFactory }, baseURL, persona);
}

/** A personal API token of the analyst, made through the account page's form as a browser would. */
async function analystToken(access: 'read' | 'read-write'): Promise<string> {
	const response = await clients.analyst.post('/app/account?/createToken', {
		headers: { accept: 'text/html' },
		form: { name: `matrix ${access}`, workspaceId: ids.workspaceId, access, lifetimeDays: '7' },
		maxRedirects: 0
	});
	expect(response.status(), 'token created').toBe(200);
	const token = /data-testid="new-token"[^>]*>(tw_[a-z2-7]{32})</.exec(await response.text())?.[1];
	if (!token) throw new Error('the account page did not show the new token');
	return token;
}

async function tokenClient(token: string): Promise<APIRequestContext> {
	return requestFactory.newContext({ baseURL, extraHTTPHeaders: { authorization: `Bearer ${token}`, origin: baseURL } });
}

function fill(template: string): string {
	return template.replace(/\[(\w+)\]|\{(\w+)\}/g, (_, a: string | undefined, b: string | undefined) => {
		const key = (a ?? b) as keyof Ids;
		if (!(key in ids)) throw new Error(`no id for ${key} in ${template}`);
		return ids[key];
	});
}

function urlOf(row: Row): string {
	const search = [row.action && row.action !== 'default' ? `/${row.action}` : '', row.query ?? ''].filter((part) => part !== '');
	return search.length > 0 ? `${fill(row.route)}?${search.join('&')}` : fill(row.route);
}

function bodyOf(row: Row) {
	// A form without fields still posts as a form, as a browser's does (SvelteKit refuses other types with 415).
	if (!row.body) return row.action ? { form: {} } : {};
	if ('json' in row.body) return { data: row.body.json };
	return { form: Object.fromEntries(Object.entries(row.body.form).map(([k, v]) => [k, fill(v)])) };
}

async function send(persona: Caller, row: Row): Promise<APIResponse> {
	const isApi = row.route.startsWith('/api/');
	// A form post asks for HTML as a browser's does: asked with */*, SvelteKit answers actions as JSON with status 200.
	const accept = isApi ? 'application/json' : 'text/html';
	return clients[persona].fetch(urlOf(row), {
		method: row.method,
		headers: { accept },
		maxRedirects: 0,
		failOnStatusCode: false,
		...bodyOf(row)
	});
}

function answerOf(response: APIResponse, expected: Answer): Answer {
	const status = response.status();
	if (status !== 303) return status;
	const location = response.headers()['location'] ?? '';
	const prefix = typeof expected === 'string' ? fill(expected.slice(4)) : '';
	// Report the expected prefix when it matches, so equal answers compare equal.
	return location.startsWith(prefix) && prefix !== '' ? expected : `303 ${location}`;
}

async function restoreProbeProject() {
	const response = await clients.owner.post(`/api/v1/projects/${ids.projectId}/restore`);
	expect(response.status(), 'restore the probe project').toBe(200);
}

async function resumeBilling(persona: Caller, response: APIResponse) {
	if (persona !== 'owner' || response.status() !== 200) return;
	const resumed = await clients.owner.post(`/app/w/${ids.workspaceId}/billing?/resume`, { headers: { accept: 'text/html' }, form: {}, maxRedirects: 0 });
	expect(resumed.status(), 'resume the plan').toBe(200);
}

async function restoreProbeScenario() {
	const response = await clients.analyst.post(`/api/v1/scenarios/${ids.scenarioId}/restore`);
	expect(response.status(), 'restore the probe scenario').toBe(200);
}

async function rejoinAfterLeaving(persona: Caller, response: APIResponse) {
	if ((persona !== 'viewer' && persona !== 'analyst') || response.status() !== 303) return;
	const { email, role } = demoUsers[persona];
	const invited = await clients.owner.post(`/app/w/${ids.workspaceId}/members?/invite`, {
		headers: { accept: 'text/html' },
		form: { email, role },
		maxRedirects: 0
	});
	expect(invited.status(), `re-invite ${persona}`).toBe(200);
	const token = await invitationTokenFor(email);
	const accepted = await clients[persona].post(`/invite/${token}?/accept`, { headers: { accept: 'text/html' }, form: {}, maxRedirects: 0 });
	expect(accepted.status(), `${persona} accepts the new invitation`).toBe(303);
	expect(accepted.headers()['location']).toBe(`/app/w/${ids.workspaceId}`);
	expect(await workspaceIdOf(clients[persona], WORKSPACE_A)).toBe(ids.workspaceId);
	if (persona === 'analyst') {
		// Leaving revoked the analyst's tokens: the token personas need new ones.
		expect((await clients.writeToken.get('/api/v1/workspaces')).status(), 'old token after leaving').toBe(401);
		await Promise.all([clients.readToken.dispose(), clients.writeToken.dispose()]);
		clients.readToken = await tokenClient(await analystToken('read'));
		clients.writeToken = await tokenClient(await analystToken('read-write'));
	}
}

/** The one room the guest may open, with its current terms accepted; answers its id. */
async function acceptRoomTerms(persona: 'investorX' | 'investorY'): Promise<string> {
	const list = await clients[persona].get('/rooms');
	const roomId = /href="\/rooms\/([0-9a-f-]{36})"/.exec(await list.text())?.[1];
	if (!roomId) throw new Error(`${persona} sees no room`);
	const terms = await clients[persona].get(`/rooms/${roomId}/terms`);
	const version = /name="termsVersion" value="(\d+)"/.exec(await terms.text())?.[1];
	if (version) {
		const accepted = await clients[persona].post(`/rooms/${roomId}/terms`, { headers: { accept: 'text/html' }, form: { termsVersion: version, next: `/rooms/${roomId}` }, maxRedirects: 0 });
		expect(accepted.status(), `${persona} accepts the terms`).toBe(303);
	}
	return roomId;
}

async function invitationTokenFor(email: string): Promise<string> {
	const response = await fetch(`http://127.0.0.1:${mailSinkHttpPort}/messages?to=${encodeURIComponent(email)}`);
	const messages = (await response.json()) as { subject: string; text: string }[];
	const invitation = messages.find((m) => m.subject.includes('invited you to'));
	const token = invitation && /\/invite\/([a-z0-9]+)/.exec(invitation.text)?.[1];
	if (!token) throw new Error(`no invitation mail to ${email}`);
	return token;
}

/**
 * A small probabilistic run of the probe scenario, started by the owner and
 * waited for until a worker (started with the app) has finished it: the run
 * rows read a run that exists, and cancelling it is refused as already ended.
 */
async function finishedProbeRun(): Promise<string> {
	const started = await clients.owner.post(`/api/v1/scenarios/${ids.scenarioId}/runs`, {
		data: {
			drivers: [{ driver: 'capex', distribution: { shape: 'triangular', min: 0.9, mode: 1, max: 1.2 } }],
			energyUncertainty: false,
			seed: 7,
			draws: 100,
			hurdleRate: 0.08
		}
	});
	expect(started.status(), await started.text()).toBe(202);
	const runId = (await started.json()).run.id as string;
	await expect
		.poll(async () => (await (await clients.owner.get(`/api/v1/scenarios/${ids.scenarioId}/runs/${runId}`)).json()).run.state, { timeout: 60_000, intervals: [250] })
		.toBe('done');
	return runId;
}

test.describe('role x route matrix', () => {
	test.beforeAll(async ({ playwright }) => {
		// Sign-ins, the probe data and a probabilistic run drawn by the worker.
		test.setTimeout(150_000);
		requestFactory = playwright.request;
		for (const persona of personas) await signIn(persona);

		ids.workspaceId = await workspaceIdOf(clients.owner, WORKSPACE_A);
		ids.workspaceB = await workspaceIdOf(clients.outsider, WORKSPACE_B);
		clients.readToken = await tokenClient(await analystToken('read'));
		clients.writeToken = await tokenClient(await analystToken('read-write'));
		expect(ids.workspaceB).not.toBe(ids.workspaceId);
		ids.token = 'not-a-token-anyone-was-sent';
		ids.revision = '1';

		// A probe project and scenario in workspace A, so the matrix never touches the demo data.
		const project = await clients.owner.post(`/api/v1/workspaces/${ids.workspaceId}/projects`, {
			data: { name: `Access probe ${Date.now().toString(36)}`, technology: 'tidal-stream', siteName: 'Probe Sound' }
		});
		expect(project.status(), await project.text()).toBe(201);
		ids.projectId = (await project.json()).project.id;
		const scenario = await clients.owner.post(`/api/v1/projects/${ids.projectId}/scenarios`, { data: { name: 'Access probe case' } });
		expect(scenario.status(), await scenario.text()).toBe(201);
		ids.scenarioId = (await scenario.json()).scenario.id;
		const upload = await clients.owner.post(`/api/v1/projects/${ids.projectId}/uploads`, {
			multipart: {
				kind: 'power-curve',
				file: { name: 'power-curve.csv', mimeType: 'text/csv', buffer: readFileSync('static/templates/power-curve.csv') }
			}
		});
		expect(upload.status(), await upload.text()).toBe(201);
		ids.uploadId = (await upload.json()).upload.id;
		ids.runId = await finishedProbeRun();

		ids.slug = METHOD_NOTES[0].slug;

		// Room X is the demo room of workspace A; each investor accepts their room's terms, as a browser would.
		ids.roomId = await acceptRoomTerms('investorX');
		await acceptRoomTerms('investorY');
		const room = await clients.investorX.get(`/rooms/${ids.roomId}`);
		expect(room.status()).toBe(200);
		ids.documentId = /\/documents\/([0-9a-f-]{36})/.exec(await room.text())?.[1] ?? '';
		expect(ids.documentId, 'a document in the demo room').not.toBe('');
		ids.version = '1';
		ids.position = '1';
	});

	test.afterAll(async () => {
		// Archived, the probe leaves the demo workspace's project list as it was.
		if (ids.projectId) await clients.owner.delete(`/api/v1/projects/${ids.projectId}`);
		await Promise.all(Object.values(clients).map((c) => c.dispose()));
	});

	for (const row of matrix) {
		const name = `${row.method} ${row.route}${row.action ? ` ?/${row.action}` : ''}${row.query ? ` ?${row.query}` : ''}`;
		test(name, async () => {
			const expected = expectedOf(row);
			const actual = {} as Record<Caller, Answer>;
			for (const persona of personas) {
				const response = await send(persona, row);
				actual[persona] = answerOf(response, expected[persona]);
				if (row.after) await row.after(persona, response);
				if ((row.endsSessions || row.endsGuestSessions) && !(tokenPersonas as readonly string[]).includes(persona)) {
					await clients[persona].dispose();
					await signIn(persona);
				}
			}
			expect(actual).toEqual(expected);
		});
	}

	test('every state-changing route refuses a body-less request from a foreign origin, and nothing changes', async () => {
		const writes = matrix.filter((row) => row.method !== 'GET');
		expect(writes.length).toBeGreaterThan(30);
		for (const row of writes) {
			for (const headers of [{ origin: 'https://evil.example' }, { origin: baseURL, 'sec-fetch-site': 'cross-site' }] as Record<string, string>[]) {
				for (const persona of ['owner', 'anonymous'] as const) {
					const response = await clients[persona].fetch(urlOf(row), { method: row.method, headers: { ...headers, accept: 'text/html' }, maxRedirects: 0, failOnStatusCode: false });
					expect(response.status(), `${row.method} ${row.route}${row.action ? ` ?/${row.action}` : ''} as ${persona} with ${JSON.stringify(headers)}`).toBe(403);
				}
			}
		}
		// The probe scenario and project are as they were: not archived, still there.
		const scenario = await clients.owner.get(`/api/v1/scenarios/${ids.scenarioId}`);
		expect(scenario.status()).toBe(200);
		expect((await scenario.json()).scenario.archivedAt).toBeNull();
		const projects = await clients.owner.get(`/api/v1/workspaces/${ids.workspaceId}/projects`);
		expect(((await projects.json()).projects as { id: string }[]).some((p) => p.id === ids.projectId)).toBe(true);
		// The owner is still signed in: the refused sign-out did nothing.
		expect((await clients.owner.get('/api/v1/workspaces')).status()).toBe(200);
		// A token-authenticated call is the one exception: no cookie rides along, so a foreign Origin is no forgery.
		const viaToken = await clients.writeToken.post(`/api/v1/scenarios/${ids.scenarioId}/base-case`, { headers: { origin: 'https://evil.example' } });
		expect(viaToken.status()).toBe(200);
	});

	test('ids that name nothing answer 404 to every signed-in persona and 401 to anonymous', async () => {
		const nowhere = '00000000-0000-4000-8000-000000000000';
		const paths = [
			`/api/v1/workspaces/${nowhere}/projects`,
			`/api/v1/projects/${nowhere}`,
			`/api/v1/scenarios/${nowhere}`,
			`/api/v1/uploads/${nowhere}`,
			`/api/v1/workspaces/${nowhere}/runs`,
			`/api/v1/scenarios/${nowhere}/runs`,
			`/api/v1/scenarios/${nowhere}/runs/${nowhere}`,
			`/api/v1/scenarios/${ids.scenarioId}/runs/${nowhere}`,
			`/api/v1/scenarios/${ids.scenarioId}/runs/${nowhere}/draws.csv`,
			`/api/v1/scenarios/${ids.scenarioId}/runs/not-a-uuid`,
			'/api/v1/projects/not-a-uuid',
			'/api/v1/scenarios/not-a-uuid'
		];
		for (const path of paths) {
			const actual = {} as Record<Caller, Answer>;
			for (const persona of personas) actual[persona] = (await clients[persona].get(path, { maxRedirects: 0 })).status();
			expect(actual, path).toEqual({ ...signedIn(404, 401), readToken: 404, writeToken: 404, investorX: 401, investorY: 401 });
		}
		const actual = {} as Record<Caller, Answer>;
		for (const persona of personas) actual[persona] = answerOf(await clients[persona].get(`/app/w/${nowhere}`, { maxRedirects: 0 }), toSignIn);
		// On pages a token is nobody: sent to sign in.
		expect(actual, '/app/w/<no such workspace>').toEqual({ ...signedIn(404), readToken: toSignIn, writeToken: toSignIn, investorX: toSignIn, investorY: toSignIn });
	});

	test('the outsider\u2019s own workspace stays closed to workspace A\u2019s members', async () => {
		const workspaceB = ids.workspaceB;
		for (const persona of ['viewer', 'analyst', 'owner'] as const) {
			expect((await clients[persona].get(`/api/v1/workspaces/${workspaceB}/projects`)).status(), persona).toBe(404);
			expect((await clients[persona].get(`/app/w/${workspaceB}`, { maxRedirects: 0 })).status(), persona).toBe(404);
		}
		expect((await clients.outsider.get(`/api/v1/workspaces/${workspaceB}/projects`)).status()).toBe(200);
		// A's tokens reach nothing of B's either.
		for (const persona of tokenPersonas) {
			expect((await clients[persona].get(`/api/v1/workspaces/${workspaceB}/projects`)).status(), persona).toBe(404);
		}
		// A's project under B's address is no way in for B's owner.
		const crossed = await clients.outsider.get(`/app/w/${workspaceB}/projects/${ids.projectId}/compare`, { maxRedirects: 0 });
		expect(crossed.status()).toBe(404);
	});

	test('a run under another scenario\u2019s address answers 404, even to those who may read both', async () => {
		const listed = await clients.viewer.get(`/api/v1/workspaces/${ids.workspaceId}/projects`);
		const otherProject = ((await listed.json()).projects as { id: string }[]).find((p) => p.id !== ids.projectId);
		if (!otherProject) throw new Error('workspace A has no project besides the probe');
		const scenarios = (await (await clients.viewer.get(`/api/v1/projects/${otherProject.id}/scenarios`)).json()).scenarios as { id: string }[];
		const otherScenario = scenarios[0]?.id;
		if (!otherScenario) throw new Error('the other project has no scenario');
		for (const persona of ['viewer', 'analyst', 'owner', 'readToken', 'writeToken'] as const) {
			expect((await clients[persona].get(`/api/v1/scenarios/${otherScenario}/runs/${ids.runId}`)).status(), persona).toBe(404);
			expect((await clients[persona].get(`/api/v1/scenarios/${otherScenario}/runs/${ids.runId}/draws.csv`)).status(), persona).toBe(404);
		}
		expect((await clients.owner.post(`/api/v1/scenarios/${otherScenario}/runs/${ids.runId}/cancel`)).status()).toBe(404);
		// Under its own scenario the same run is there.
		expect((await clients.viewer.get(`/api/v1/scenarios/${ids.scenarioId}/runs/${ids.runId}`)).status()).toBe(200);
	});

	test('a page address whose ids do not nest (scenario under another project) answers 404', async () => {
		const listed = await clients.viewer.get(`/api/v1/workspaces/${ids.workspaceId}/projects`);
		const otherProject = ((await listed.json()).projects as { id: string }[]).find((p) => p.id !== ids.projectId);
		if (!otherProject) throw new Error('workspace A has no project besides the probe');
		const misnested = `/app/w/${ids.workspaceId}/projects/${otherProject.id}/scenarios/${ids.scenarioId}/sensitivity`;
		expect((await clients.viewer.get(misnested, { maxRedirects: 0 })).status()).toBe(404);
		const proper = `/app/w/${ids.workspaceId}/projects/${ids.projectId}/scenarios/${ids.scenarioId}/sensitivity`;
		expect((await clients.viewer.get(proper, { maxRedirects: 0 })).status()).toBe(200);
	});
});

/** Every route under src/routes, as route id, methods and form actions. */
function routesOnDisk(): { route: string; method: Method; action?: string }[] {
	const root = 'src/routes';
	const found: { route: string; method: Method; action?: string }[] = [];
	const walk = (dir: string) => {
		for (const entry of readdirSync(dir, { withFileTypes: true })) {
			const full = join(dir, entry.name);
			if (entry.isDirectory()) {
				walk(full);
				continue;
			}
			const route =
				'/' +
				relative(root, dir)
					.split(sep)
					.filter((segment) => segment !== '' && !/^\(.+\)$/.test(segment))
					.join('/');
			if (entry.name === '+page.svelte' || entry.name === '+page.server.ts') {
				found.push({ route, method: 'GET' });
			}
			if (entry.name === '+page.server.ts') {
				const source = readFileSync(full, 'utf8');
				const actions = source.split(/export const actions\b/)[1];
				if (actions) for (const match of actions.matchAll(/^\t(\w+): async\b/gm)) found.push({ route, method: 'POST', action: match[1] });
			}
			if (entry.name === '+server.ts') {
				const source = readFileSync(full, 'utf8');
				for (const match of source.matchAll(/export (?:const|async function) (GET|POST|PUT|PATCH|DELETE)\b/g)) {
					found.push({ route, method: match[1] as Method });
				}
			}
		}
	};
	walk(root);
	const keys = new Set<string>();
	return found.filter((r) => {
		const key = `${r.method} ${r.route} ${r.action ?? ''}`;
		if (keys.has(key)) return false;
		keys.add(key);
		return true;
	});
}

test.describe('the matrix covers every route', () => {
	const key = (r: { route: string; method: Method; action?: string }) => `${r.method} ${r.route}${r.action ? ` ?/${r.action}` : ''}`;

	test('every page, form action and API method under src/routes has a row', () => {
		const rows = new Set(matrix.map(key));
		const missing = routesOnDisk().map(key).filter((k) => !rows.has(k));
		expect(missing, 'routes without a row in tests/e2e/access-matrix.spec.ts').toEqual([]);
	});

	test('every row names a route that exists', () => {
		const onDisk = new Set(routesOnDisk().map(key));
		const stale = matrix.map(key).filter((k) => !onDisk.has(k));
		expect(stale, 'rows for routes that are gone').toEqual([]);
	});
});
