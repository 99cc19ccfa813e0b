/**
 * The team's PDF summary route against a real database and the real compute
 * pool: a viewer gets a PDF of the saved revision drawn on a worker thread
 * (with the revision's latest finished probabilistic run, unless asked not
 * to), someone outside the workspace gets the same 404 as for any hidden
 * scenario.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestDatabase, type TestDatabase } from '../helpers/db';
import { setAppEnv } from '../helpers/app-env';
import { callRoute, newSessionUser } from '../helpers/route-event';
import { tidalDocument } from '../fixtures/scenario-documents';
import { CAUTIONS } from '../../src/lib/cautions';
import { computePool } from '../../src/lib/server/compute/pool';
import { addMember } from '../../src/lib/server/db/memberships';
import { createProject } from '../../src/lib/server/db/projects';
import { createScenario } from '../../src/lib/server/db/scenarios';
import { createWorkspaceWithOwner } from '../../src/lib/server/db/workspaces';
import { ENGINE_VERSION } from '../../src/lib/server/engine/version';
import { P90_CONVENTION } from '../../src/lib/probabilistic/run-report';
import { handMadeInput, handMadeSummary } from '../fixtures/probabilistic-run';
import * as summaryRoute from '../../src/routes/api/v1/scenarios/[scenarioId]/summary.pdf/+server';

let database: TestDatabase;
let folder: string;

beforeAll(async () => {
	database = await createTestDatabase();
	setAppEnv({ DATABASE_URL: database.url });
	folder = mkdtempSync(join(tmpdir(), 'tidewright-summary-route-'));
});
afterAll(async () => {
	await (await computePool()).close();
	await database.drop();
	rmSync(folder, { recursive: true, force: true });
});

async function savedScenario() {
	const owner = await newSessionUser(database.knex, 'owner');
	const viewer = await newSessionUser(database.knex, 'viewer');
	const workspace = await createWorkspaceWithOwner(`Halvard Marine ${randomUUID()}`, owner.id, database.knex);
	await addMember(workspace.id, viewer.id, 'viewer', database.knex);
	const project = await createProject({ workspaceId: workspace.id, name: 'Kestle Narrows array', technology: 'tidal-stream', siteName: 'Kestle Narrows' }, database.knex);
	const scenario = await createScenario({ projectId: project.id, name: 'Base case: lenders / P50', document: tidalDocument, userId: owner.id }, database.knex);
	return { viewer, scenarioId: scenario.id, workspaceId: workspace.id, projectId: project.id };
}

function pdfText(bytes: Buffer, name: string): string {
	const file = join(folder, name);
	writeFileSync(file, bytes);
	return execFileSync('pdftotext', ['-enc', 'UTF-8', file, '-'], { encoding: 'utf8' }).replace(/\s+/g, ' ');
}

describe('GET /api/v1/scenarios/[scenarioId]/summary.pdf', () => {
	it("answers a viewer with the saved revision's PDF as an attachment, named from the scenario", async () => {
		const { viewer, scenarioId } = await savedScenario();
		const response = await callRoute(summaryRoute.GET, viewer, { path: `/api/v1/scenarios/${scenarioId}/summary.pdf`, params: { scenarioId } });
		expect(response.status).toBe(200);
		expect(response.headers.get('content-type')).toBe('application/pdf');
		expect(response.headers.get('content-disposition')).toBe('attachment; filename="base-case-lenders-p50-r1-summary.pdf"');
		const bytes = Buffer.from(await response.arrayBuffer());
		expect(Number(response.headers.get('content-length'))).toBe(bytes.length);
		expect(bytes.subarray(0, 5).toString('latin1')).toBe('%PDF-');

		const file = join(folder, 'team.pdf');
		writeFileSync(file, bytes);
		const text = execFileSync('pdftotext', ['-enc', 'UTF-8', file, '-'], { encoding: 'utf8' }).replace(/\s+/g, ' ');
		expect(text).toContain('Kestle Narrows array');
		expect(text).toContain('Base case: lenders / P50, revision 1');
		expect(text).toContain('Team copy · Page 1 of');
		expect(text).toContain('Tornado: LCOE, real');
		for (const caution of CAUTIONS) expect(text).toContain(caution);
		expect(text).not.toContain('Prepared for');
	});

	it("prints the revision's latest finished probabilistic run with its method note, and leaves it out with ?run=none", async () => {
		const { viewer, scenarioId, workspaceId, projectId } = await savedScenario();
		await database.knex('workspaces').where({ id: workspaceId }).update({ plan: 'team', plan_status: 'active' });
		// A finished run of revision 1, as a worker leaves it (migrations/20261208000001_probabilistic_runs.ts).
		const input = handMadeInput();
		await database.knex('probabilistic_runs').insert({
			workspace_id: workspaceId,
			project_id: projectId,
			scenario_id: scenarioId,
			scenario_revision: 1,
			engine_version: ENGINE_VERSION,
			input: JSON.stringify(input),
			seed: input.seed,
			draws: input.draws,
			chunk_size: 50,
			state: 'done',
			draws_done: input.draws,
			summary: JSON.stringify(handMadeSummary()),
			started_at: new Date(Date.now() - 60_000),
			finished_at: new Date()
		});

		const path = `/api/v1/scenarios/${scenarioId}/summary.pdf`;
		const withRun = await callRoute(summaryRoute.GET, viewer, { path, params: { scenarioId } });
		expect(withRun.status).toBe(200);
		const text = pdfText(Buffer.from(await withRun.arrayBuffer()), 'team-with-run.pdf');
		expect(text).toContain(`100 draws, seed ${input.seed}, engine ${ENGINE_VERSION}`);
		expect(text).toContain(P90_CONVENTION);
		expect(text).toContain('Equity IRR: how 100 draws spread');
		expect(text).toContain('Probabilistic runs: P10, P50 and P90 of every result');

		const withoutRun = await callRoute(summaryRoute.GET, viewer, { path: `${path}?run=none`, params: { scenarioId } });
		expect(withoutRun.status).toBe(200);
		const plain = pdfText(Buffer.from(await withoutRun.arrayBuffer()), 'team-without-run.pdf');
		expect(plain).toContain('Tornado: LCOE, real');
		expect(plain).not.toContain(P90_CONVENTION);
		expect(plain).not.toContain('Probabilistic runs: P10, P50 and P90 of every result');
	});

	it('answers someone outside the workspace with 404, as for a scenario that does not exist', async () => {
		const { scenarioId } = await savedScenario();
		const outsider = await newSessionUser(database.knex, 'outsider');
		const response = await callRoute(summaryRoute.GET, outsider, { path: `/api/v1/scenarios/${scenarioId}/summary.pdf`, params: { scenarioId } });
		expect(response.status).toBe(404);
		expect(response.headers.get('content-type')).toMatch(/json/);
	});
});
