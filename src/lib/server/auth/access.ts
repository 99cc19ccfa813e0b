/**
 * The one door. Every load, action and API route asks `authorize` (or
 * `requireUser` / `requireBrowserSession` where no workspace is involved),
 * with the principal that `hooks.server.ts` resolved.
 *
 * - Nobody signed in: 401 on the API, a redirect to sign-in on pages.
 * - A workspace, project, scenario or upload the caller may not see, or that
 *   does not exist: 404 with the same words, so existence stays hidden. Ids in
 *   the URL must nest (the scenario in the project in the workspace).
 * - A role too low for the action: 403 naming the role needed.
 * - An API token acts in its own workspace only, with its member's current
 *   role there; a read-only token at most as a viewer. Tokens never manage
 *   accounts, members, tokens or billing (`requireBrowserSession`).
 */
import { error, redirect, type RequestEvent } from '@sveltejs/kit';
import { listWorkspacesForUser, type WorkspaceMembership } from '../db/memberships';
import { getProjectById, getProjectOfScenario, getProjectOfUpload, getRoomAndProject, type ProjectRow } from '../db/projects';
import type { RoomRow } from '../db/rooms';
import { getScenarioWithProject, type ScenarioRecord } from '../db/scenarios';
import { projectReads } from '../db/cached-reads';
import { roleAtLeast, type WorkspaceRole } from './roles';
import type { ApiTokenPrincipal, GuestPrincipal, MemberPrincipal, Principal } from './principal';
import type { SessionUser } from './session';

type AccessEvent = Pick<RequestEvent, 'locals' | 'url'> & Partial<Pick<RequestEvent, 'request'>>;

const uuidPattern = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

export function isUuid(value: string): boolean {
	return uuidPattern.test(value);
}

function isApiRequest(event: Pick<RequestEvent, 'url'>) {
	return event.url.pathname.startsWith('/api/');
}

/** Who is asking, as the workspace side sees it: a room guest is nobody here (guests have their own door, src/lib/server/rooms/guest-access.ts). */
export function principalOf(event: Pick<RequestEvent, 'locals'>): Exclude<Principal, GuestPrincipal> {
	const principal = event.locals.principal ?? { kind: 'anonymous' };
	return principal.kind === 'guest' ? { kind: 'anonymous' } : principal;
}

function refuseAnonymous(event: AccessEvent): never {
	if (isApiRequest(event)) error(401, 'Sign in, or send a personal API token in the header Authorization: Bearer tw_...');
	redirect(303, `/signin?next=${encodeURIComponent(event.url.pathname + event.url.search)}`);
}

/** The member behind the request, signed in or by token. */
export function requireUser(event: AccessEvent): SessionUser {
	const principal = principalOf(event);
	if (principal.kind === 'anonymous') refuseAnonymous(event);
	return principal.user;
}

/** A member signed in in the browser: accounts, members, tokens and billing are never managed with an API token. */
export function requireBrowserSession(event: AccessEvent): MemberPrincipal {
	const principal = principalOf(event);
	if (principal.kind === 'anonymous') refuseAnonymous(event);
	if (principal.kind === 'token') error(403, 'API tokens cannot manage accounts, members, tokens or billing: sign in in the browser for that.');
	return principal;
}

export interface WorkspaceAccess {
	principal: MemberPrincipal | ApiTokenPrincipal;
	user: SessionUser;
	/** The workspace and the caller's effective role in it (a read-only token's is at most viewer). */
	membership: WorkspaceMembership;
}

export interface ProjectAccess extends WorkspaceAccess {
	project: ProjectRow;
}

export interface ScenarioAccess extends ProjectAccess {
	scenarioId: string;
}

export interface UploadAccess extends ProjectAccess {
	uploadId: string;
}

export interface RoomAccess extends ProjectAccess {
	roomId: string;
	/** The room itself, read with its project by the door. */
	room: RoomRow;
}

type Place = { workspaceId?: string; projectId?: string };

const hidden = {
	workspace: 'No such workspace, or it is not yours.',
	project: 'No such project, or it is not yours.',
	scenario: 'No such scenario, or it is not yours.',
	upload: 'No such upload, or it is not yours.',
	room: 'No such data room, or it is not yours.'
} as const;

function effectiveRole(principal: MemberPrincipal | ApiTokenPrincipal, role: WorkspaceRole): WorkspaceRole {
	return principal.kind === 'token' && principal.token.access === 'read' ? 'viewer' : role;
}

function article(role: WorkspaceRole) {
	return role === 'viewer' ? 'a' : 'an';
}

/**
 * The caller's memberships, read once per page view (with the session itself,
 * for a signed-in member): a layout and its page both ask, and each would
 * otherwise query again. Only reads share it; a form action (which may change
 * memberships) always reads afresh.
 */
const membershipsOfView = new WeakMap<App.Locals, Promise<WorkspaceMembership[]>>();

function membershipsOf(event: AccessEvent, userId: string): Promise<WorkspaceMembership[]> {
	const method = event.request?.method ?? 'GET';
	if (method !== 'GET' && method !== 'HEAD') return listWorkspacesForUser(userId);
	let memberships = membershipsOfView.get(event.locals);
	const principal = principalOf(event);
	if (!memberships && principal.kind === 'member' && principal.memberships) memberships = Promise.resolve(principal.memberships);
	if (!memberships) {
		memberships = listWorkspacesForUser(userId);
		membershipsOfView.set(event.locals, memberships);
	}
	return memberships;
}

/**
 * The project behind an id in the address, looked up once per page view: the
 * workspace layout and the page below it both authorize the same params.
 * Reads only, like the memberships above.
 */
const projectsOfView = new WeakMap<App.Locals, Map<string, Promise<ProjectRow | undefined>>>();

function projectOf(event: AccessEvent, key: string, lookup: () => Promise<ProjectRow | undefined>): Promise<ProjectRow | undefined> {
	const method = event.request?.method ?? 'GET';
	if (method !== 'GET' && method !== 'HEAD') return lookup();
	let view = projectsOfView.get(event.locals);
	if (!view) {
		view = new Map();
		projectsOfView.set(event.locals, view);
	}
	let project = view.get(key);
	if (!project) {
		project = lookup();
		view.set(key, project);
	}
	return project;
}

/** Scenarios read with their project while a page view was authorized, for the page to use without a second query. */
const scenariosOfView = new WeakMap<App.Locals, Map<string, ScenarioRecord>>();

function isRead(event: AccessEvent): boolean {
	const method = event.request?.method ?? 'GET';
	return method === 'GET' || method === 'HEAD';
}

/** On a read, the project of a scenario and the scenario itself in one query; the scenario is kept for `scenarioReadInView`. */
function projectOfScenarioInView(event: AccessEvent, scenarioId: string): Promise<ProjectRow | undefined> {
	return projectOf(event, `scenario:${scenarioId}`, async () => {
		if (!isRead(event)) return getProjectOfScenario(scenarioId);
		const found = await projectReads.read(`scenario-with-project:${scenarioId}`, () => getScenarioWithProject(scenarioId), (read) => read.project.id);
		if (!found) return undefined;
		const seen = scenariosOfView.get(event.locals) ?? new Map<string, ScenarioRecord>();
		seen.set(scenarioId, found.scenario);
		scenariosOfView.set(event.locals, seen);
		return found.project;
	});
}

/** The scenario `authorize` already read for this page view (reads only), or undefined. */
export function scenarioReadInView(event: Pick<RequestEvent, 'locals'>, scenarioId: string): ScenarioRecord | undefined {
	return scenariosOfView.get(event.locals)?.get(scenarioId);
}

async function membershipIn(event: AccessEvent, workspaceId: string, userId: string): Promise<WorkspaceMembership | undefined> {
	return (await membershipsOf(event, userId)).find((m) => m.workspaceId === workspaceId);
}

async function workspaceAccess(event: AccessEvent, workspaceId: string, minimum: WorkspaceRole, notFound: string): Promise<WorkspaceAccess> {
	const principal = principalOf(event);
	if (principal.kind === 'anonymous') refuseAnonymous(event);
	if (!isUuid(workspaceId)) error(404, notFound);
	if (principal.kind === 'token' && principal.token.workspaceId !== workspaceId) error(404, notFound);
	const membership = await membershipIn(event, workspaceId, principal.user.id);
	if (!membership) error(404, notFound);
	const role = effectiveRole(principal, membership.role);
	if (!roleAtLeast(role, minimum)) {
		if (principal.kind === 'token' && roleAtLeast(membership.role, minimum)) {
			error(403, `This API token is read-only; this needs a read-and-write token of ${article(minimum)} ${minimum}.`);
		}
		error(403, `This needs the ${minimum} role in ${membership.workspaceName}; you are ${article(role)} ${role}.`);
	}
	return { principal, user: principal.user, membership: { ...membership, role } };
}

async function projectAccess(event: AccessEvent, project: ProjectRow | undefined, place: Place, minimum: WorkspaceRole, notFound: string) {
	if (!project) error(404, notFound);
	if (place.workspaceId !== undefined && place.workspaceId !== project.workspace_id) error(404, notFound);
	if (place.projectId !== undefined && place.projectId !== project.id) error(404, notFound);
	const access = await workspaceAccess(event, project.workspace_id, minimum, notFound);
	return { ...access, project };
}

/**
 * The one check for anything inside a workspace. Pass the route's params:
 * the innermost id decides what is asked for, the outer ones must contain it.
 */
export function authorize(event: AccessEvent, target: { scenarioId: string } & Place, minimum: WorkspaceRole): Promise<ScenarioAccess>;
export function authorize(event: AccessEvent, target: { uploadId: string } & Place, minimum: WorkspaceRole): Promise<UploadAccess>;
export function authorize(event: AccessEvent, target: { roomId: string } & Place, minimum: WorkspaceRole): Promise<RoomAccess>;
export function authorize(event: AccessEvent, target: { projectId: string; workspaceId?: string }, minimum: WorkspaceRole): Promise<ProjectAccess>;
export function authorize(event: AccessEvent, target: { workspaceId: string }, minimum: WorkspaceRole): Promise<WorkspaceAccess>;
export async function authorize(
	event: AccessEvent,
	target: { workspaceId?: string; projectId?: string; scenarioId?: string; uploadId?: string; roomId?: string },
	minimum: WorkspaceRole
): Promise<WorkspaceAccess | ProjectAccess | ScenarioAccess | UploadAccess | RoomAccess> {
	if (principalOf(event).kind === 'anonymous') refuseAnonymous(event);
	const place = { workspaceId: target.workspaceId, projectId: target.projectId };
	if (target.scenarioId !== undefined) {
		const scenarioId = target.scenarioId;
		const project = isUuid(scenarioId) ? await projectOfScenarioInView(event, scenarioId) : undefined;
		const access = await projectAccess(event, project, place, minimum, hidden.scenario);
		return { ...access, scenarioId: target.scenarioId };
	}
	if (target.uploadId !== undefined) {
		const uploadId = target.uploadId;
		const project = isUuid(uploadId) ? await projectOf(event, `upload:${uploadId}`, () => getProjectOfUpload(uploadId)) : undefined;
		const access = await projectAccess(event, project, place, minimum, hidden.upload);
		return { ...access, uploadId: target.uploadId };
	}
	if (target.roomId !== undefined) {
		const roomId = target.roomId;
		const found = isUuid(roomId) ? await getRoomAndProject(roomId) : undefined;
		const access = await projectAccess(event, found?.project, place, minimum, hidden.room);
		return { ...access, roomId, room: found!.room };
	}
	if (target.projectId !== undefined) {
		const projectId = target.projectId;
		const project = isUuid(projectId) ? await projectOf(event, `project:${projectId}`, () => getProjectById(projectId)) : undefined;
		return projectAccess(event, project, { workspaceId: target.workspaceId }, minimum, hidden.project);
	}
	if (target.workspaceId !== undefined) return workspaceAccess(event, target.workspaceId, minimum, hidden.workspace);
	throw new Error('authorize needs a workspace, project, scenario or upload id');
}

/**
 * The same check as authorize for a project, for a route that reads the
 * project together with its own data in one query: `read` gets the project
 * id (a valid id only) and returns the project with that data, or undefined;
 * nothing it read leaves here unless the caller may see the project.
 */
export async function authorizeProjectRead<T extends { project: ProjectRow }>(
	event: AccessEvent,
	target: { projectId: string; workspaceId?: string },
	minimum: WorkspaceRole,
	read: (projectId: string) => Promise<T | undefined>
): Promise<{ access: ProjectAccess; read: T }> {
	if (principalOf(event).kind === 'anonymous') refuseAnonymous(event);
	const found = isUuid(target.projectId) ? await read(target.projectId) : undefined;
	const access = await projectAccess(event, found?.project, { workspaceId: target.workspaceId, projectId: target.projectId }, minimum, hidden.project);
	return { access, read: found! };
}

/** Whether the caller's effective role reaches `minimum` (for showing or hiding controls). */
export function canAct(access: WorkspaceAccess, minimum: WorkspaceRole): boolean {
	return roleAtLeast(access.membership.role, minimum);
}

/** The workspaces the caller may see, each with the caller's effective role: a token sees its own workspace only. */
export async function visibleWorkspaces(event: AccessEvent): Promise<WorkspaceMembership[]> {
	const principal = principalOf(event);
	if (principal.kind === 'anonymous') refuseAnonymous(event);
	const memberships = await membershipsOf(event, principal.user.id);
	return memberships
		.filter((m) => principal.kind !== 'token' || m.workspaceId === principal.token.workspaceId)
		.map((m) => ({ ...m, role: effectiveRole(principal, m.role) }));
}
