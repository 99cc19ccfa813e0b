/**
 * Shared steps of the workbench API specs: the demo personas' HTTP clients,
 * a fresh project and scenario per test, and readers for the error shape
 * `{ error: { message, issues: [{ path, message }] } }`.
 */
import { expect, type APIRequestContext, type APIResponse } from '@playwright/test';
import { request as playwrightRequest } from '@playwright/test';
import { signedInRequest, workspaceIdOf, type Persona } from './session';
import { tidalInput } from '../../fixtures/scenario-documents';

export const DEMO_WORKSPACE = 'Halvard Marine Energy';

export type Clients = Record<Persona, APIRequestContext>;

export async function signInEveryone(playwright: { request: typeof playwrightRequest }, baseURL: string): Promise<Clients> {
	const personas: Persona[] = ['owner', 'analyst', 'viewer', 'outsider', 'anonymous'];
	const contexts = await Promise.all(personas.map((p) => signedInRequest(playwright, baseURL, p)));
	return Object.fromEntries(personas.map((p, i) => [p, contexts[i]])) as Clients;
}

export async function disposeAll(clients: Clients | undefined) {
	if (clients) await Promise.all(Object.values(clients).map((c) => c.dispose()));
}

export async function demoWorkspaceId(clients: Clients): Promise<string> {
	return workspaceIdOf(clients.analyst, DEMO_WORKSPACE);
}

let counter = 0;
export function uniqueName(label: string): string {
	counter += 1;
	return `${label} ${Date.now().toString(36)}-${counter}`;
}

export interface ProjectJson {
	id: string;
	name: string;
	technology: string;
	currency: string;
	archivedAt: string | null;
}

export interface ScenarioJson {
	id: string;
	projectId: string;
	name: string;
	notes: string;
	revision: number;
	isBaseCase: boolean;
	archivedAt: string | null;
	document: typeof tidalInput & Record<string, unknown>;
}

export async function newProject(
	client: APIRequestContext,
	workspaceId: string,
	body: Record<string, unknown> = {}
): Promise<ProjectJson> {
	const response = await client.post(`/api/v1/workspaces/${workspaceId}/projects`, {
		data: { name: uniqueName('Test array'), technology: 'tidal-stream', siteName: 'Test Sound', ...body }
	});
	expect(response.status(), await response.text()).toBe(201);
	return (await response.json()).project;
}

export async function newScenario(
	client: APIRequestContext,
	projectId: string,
	body: Record<string, unknown> = {}
): Promise<ScenarioJson> {
	const response = await client.post(`/api/v1/projects/${projectId}/scenarios`, {
		data: { name: uniqueName('Case'), document: tidalInput, ...body }
	});
	expect(response.status(), await response.text()).toBe(201);
	return (await response.json()).scenario;
}

export interface ErrorBody {
	error: { message: string; issues: { path: string; message: string; row?: number | null; column?: string | null }[]; [key: string]: unknown };
}

/** Checks the status and the error shape, and answers the body. */
export async function expectError(response: APIResponse, status: number): Promise<ErrorBody> {
	const text = await response.text();
	expect(response.status(), text).toBe(status);
	expect(response.headers()['content-type']).toContain('application/json');
	const body = JSON.parse(text) as ErrorBody;
	expect(typeof body.error.message).toBe('string');
	expect(body.error.message.length).toBeGreaterThan(0);
	expect(Array.isArray(body.error.issues)).toBe(true);
	return body;
}

export function issuePaths(body: ErrorBody): string[] {
	return body.error.issues.map((i) => i.path);
}
