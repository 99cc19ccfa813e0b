/**
 * A CSV uploaded with a cell a spreadsheet would run as a formula (in a notes
 * column the parser ignores) is stored as sent, and comes back from the
 * download route with that cell defused, as the exports do it.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestDatabase, type TestDatabase } from '../helpers/db';
import { setAppEnv } from '../helpers/app-env';
import { callRoute, newSessionUser } from '../helpers/route-event';
import type { SessionUser } from '../../src/lib/server/auth/session';
import { createProject } from '../../src/lib/server/db/projects';
import { getUploadContent } from '../../src/lib/server/db/uploads';
import { createWorkspaceWithOwner } from '../../src/lib/server/db/workspaces';
import * as uploadsRoute from '../../src/routes/api/v1/projects/[projectId]/uploads/+server';
import * as fileRoute from '../../src/routes/api/v1/uploads/[uploadId]/file/+server';

let database: TestDatabase;
let analyst: SessionUser;
let projectId: string;

beforeAll(async () => {
	database = await createTestDatabase();
	setAppEnv({ DATABASE_URL: database.url });
	analyst = await newSessionUser(database.knex, 'loader');
	const workspace = await createWorkspaceWithOwner('Skerrow Energy', analyst.id, database.knex);
	projectId = (await createProject({ workspaceId: workspace.id, name: 'Skerrow Race', technology: 'tidal-stream' }, database.knex)).id;
});
afterAll(() => database.drop());

const withFormula = 'speed_m_s,power_kW,note\r\n0.5,0,=1+1\r\n1.0,100,ok\r\n1.5,300,@SUM(A1:A9)\r\n2.0,500,\r\n2.5,800,\r\n3.0,1000,-rated\r\n';

async function upload(text: string) {
	const form = new FormData();
	form.set('kind', 'power-curve');
	form.set('file', new File([text], 'curve with notes.csv', { type: 'text/csv' }));
	const response = await callRoute(uploadsRoute.POST, analyst, { method: 'POST', path: `/api/v1/projects/${projectId}/uploads`, params: { projectId }, body: form });
	expect(response.status, await response.clone().text()).toBe(201);
	return (await response.json()).upload as { id: string };
}

describe('GET /api/v1/uploads/:uploadId/file', () => {
	it('answers a stored CSV with its formula cells defused, as an attachment', async () => {
		const stored = await upload(withFormula);
		expect((await getUploadContent(stored.id, database.knex))!.content.toString('utf8')).toBe(withFormula);

		const response = await callRoute(fileRoute.GET, analyst, { path: `/api/v1/uploads/${stored.id}/file`, params: { uploadId: stored.id } });
		expect(response.status).toBe(200);
		expect(response.headers.get('content-type')).toBe('text/csv; charset=utf-8');
		expect(response.headers.get('content-disposition')).toBe('attachment; filename="curve-with-notes.csv"');
		const body = await response.text();
		expect(body).toBe("speed_m_s,power_kW,note\r\n0.5,0,'=1+1\r\n1.0,100,ok\r\n1.5,300,'@SUM(A1:A9)\r\n2.0,500,\r\n2.5,800,\r\n3.0,1000,'-rated\r\n");
		expect(Number(response.headers.get('content-length'))).toBe(new TextEncoder().encode(body).byteLength);
	});
});
