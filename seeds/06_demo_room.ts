/**
 * The demo's data room: Halvard Marine Energy's tidal project shares its base
 * case and downside, frozen as version 1, with two documents (the speed
 * histogram as CSV and a one-page consents letter as PDF), and an invited demo
 * investor of an invented fund who has a password but has not yet accepted the
 * room's terms, so the demo shows that step. Runs only while no room exists.
 */
import type { Knex } from 'knex';
import { hash } from '@node-rs/argon2';
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { demoProjects, demoWorkspace } from './01_demo_workspace';
import { CAUTIONS } from '../src/lib/cautions';
import { parseNote } from '../src/lib/server/methods/parse-note';
import { METHOD_NOTES } from '../src/lib/methods';
import { ENGINE_VERSION } from '../src/lib/server/engine/version';
import { assembleSnapshot, type SnapshotScenario } from '../src/lib/server/rooms/snapshot-format';
import { checkRoomDocument } from '../src/lib/server/rooms/document-check';
import { DEFAULT_TERMS_TEXT } from '../src/lib/server/rooms/terms';
import { projectRoot } from '../docker-local/postgres';

export const demoInvestor = {
	email: 'maren.oakhurst@corriemoor-capital.example',
	name: 'Maren Oakhurst',
	password: 'slack-tide-investor-26',
	fund: 'Corriemoor Capital'
} as const;

export const demoRoomName = 'Kestle Narrows financing room';

/** A second room, in the consultancy's workspace, with an investor of its own: neither investor sees the other's room. */
export const secondInvestor = {
	email: 'tobias.wrenfield@saltmarsh-lenders.example',
	name: 'Tobias Wrenfield',
	password: 'neap-tide-lender-26',
	fund: 'Saltmarsh Infrastructure Lenders'
} as const;
export const secondRoomName = 'Quenmoor Sound lender room';

/** A one-page PDF written by hand (PDF 1.4: catalog, page, font, one text stream, xref). */
function consentsLetterPdf(): Uint8Array {
	const text = 'BT /F1 14 Tf 72 760 Td (Kestle Narrows Tidal Array - consents letter) Tj 0 -24 Td /F1 11 Tf (Invented for the Tidewright demo: the marine licence is granted for ten devices.) Tj ET';
	const objects = [
		'<< /Type /Catalog /Pages 2 0 R >>',
		'<< /Type /Pages /Kids [3 0 R] /Count 1 >>',
		'<< /Type /Page /Parent 2 0 R /MediaBox [0 0 595 842] /Resources << /Font << /F1 5 0 R >> >> /Contents 4 0 R >>',
		`<< /Length ${text.length} >>\nstream\n${text}\nendstream`,
		'<< /Type /Font /Subtype /Type1 /BaseFont /Helvetica >>'
	];
	let body = '%PDF-1.4\n';
	const offsets: number[] = [];
	objects.forEach((object, i) => {
		offsets.push(body.length);
		body += `${i + 1} 0 obj\n${object}\nendobj\n`;
	});
	const xref = body.length;
	body += `xref\n0 ${objects.length + 1}\n0000000000 65535 f \n${offsets.map((o) => `${String(o).padStart(10, '0')} 00000 n \n`).join('')}`;
	body += `trailer\n<< /Size ${objects.length + 1} /Root 1 0 R >>\nstartxref\n${xref}\n%%EOF\n`;
	return new TextEncoder().encode(body);
}

function histogramCsv(document: { resource: { kind: string; bins?: { speedMPerS: number; occurrence: number }[] } }): Uint8Array {
	const bins = document.resource.bins ?? [];
	return new TextEncoder().encode(['speed_m_per_s,hours_per_year', ...bins.map((b) => `${b.speedMPerS},${b.occurrence}`)].join('\r\n') + '\r\n');
}

function methodNotes() {
	const folder = join(projectRoot, 'docs', 'methods');
	const titles = new Map<string, string>(METHOD_NOTES.map((n) => [n.slug, n.title]));
	return readdirSync(folder)
		.filter((f) => f.endsWith('.md'))
		.sort()
		.map((f) => {
			const slug = f.replace(/\.md$/, '');
			const markdown = readFileSync(join(folder, f), 'utf8');
			return { ...parseNote(slug, markdown, titles.get(slug) ?? slug), markdown };
		});
}

interface RoomSeed {
	workspaceSlug: string;
	projectName: string | null;
	roomName: string;
	investor: { email: string; name: string; password: string };
	withDocuments: boolean;
}

export async function seed(knex: Knex): Promise<void> {
	const [{ count }] = await knex('data_rooms').count<{ count: string }[]>({ count: '*' });
	if (Number(count) > 0) return;
	await seedRoom(knex, { workspaceSlug: demoWorkspace.slug, projectName: demoProjects[0].name, roomName: demoRoomName, investor: demoInvestor, withDocuments: true });
	await seedRoom(knex, { workspaceSlug: 'corvane-advisory', projectName: null, roomName: secondRoomName, investor: secondInvestor, withDocuments: false });
}

async function seedRoom(knex: Knex, spec: RoomSeed): Promise<void> {
	const workspace = await knex('workspaces').select('id').where({ slug: spec.workspaceSlug }).first();
	if (!workspace) return;
	const projectQuery = knex('projects').select('*').where({ workspace_id: workspace.id }).whereNull('archived_at').orderBy('name');
	const project = await (spec.projectName ? projectQuery.where({ name: spec.projectName }) : projectQuery).first();
	// The room's maker: an owner or analyst of the workspace.
	const analyst = await knex('memberships').select('user_id as id').where({ workspace_id: workspace.id }).whereIn('role', ['analyst', 'owner']).orderBy('role').first();
	if (!project || !analyst) return;
	const scenarios = await knex('scenarios')
		.join('scenario_results', function () {
			this.on('scenario_results.scenario_id', 'scenarios.id').andOn('scenario_results.revision', 'scenarios.revision').andOnVal('scenario_results.engine_version', ENGINE_VERSION);
		})
		.select('scenarios.*', 'scenario_results.result')
		.where('scenarios.project_id', project.id)
		.whereNull('scenarios.archived_at')
		.orderBy([{ column: 'is_base_case', order: 'desc' }, { column: 'name' }]);
	if (scenarios.length === 0) return;
	const frozen: SnapshotScenario[] = scenarios.map((s) => ({ id: s.id, name: s.name, notes: s.notes, revision: s.revision, isBaseCase: s.is_base_case, document: s.document, result: s.result }));
	const snapshot = assembleSnapshot({ project, scenarios: frozen, methodNotes: methodNotes(), cautions: CAUTIONS });
	const passwordHash = await hash(spec.investor.password, { memoryCost: 19_456, timeCost: 2, parallelism: 1 });

	await knex.transaction(async (trx) => {
		const [room] = await trx('data_rooms')
			.insert({ workspace_id: workspace.id, project_id: project.id, name: spec.roomName, terms: DEFAULT_TERMS_TEXT, created_by: analyst.id })
			.returning(['id']);
		await trx('data_room_versions').insert({ room_id: room.id, version: 1, snapshot: JSON.stringify(snapshot), engine_version: ENGINE_VERSION, published_by: analyst.id });
		const files = spec.withDocuments
			? [
					{ fileName: 'Kestle Narrows speed histogram.csv', bytes: histogramCsv(frozen[0].document), folder: 'Resource', access: 'download' },
					{ fileName: 'Consents letter.pdf', bytes: consentsLetterPdf(), folder: 'Consents', access: 'view' }
				]
			: [];
		for (const file of files) {
			const checked = checkRoomDocument({ fileName: file.fileName, bytes: file.bytes });
			if (!checked.ok) throw new Error(`demo document refused: ${checked.reason}`);
			await trx('data_room_documents').insert({
				room_id: room.id,
				folder: file.folder,
				file_name: checked.safeFileName,
				kind: checked.kind,
				content_type: checked.contentType,
				byte_size: checked.byteSize,
				sha256: checked.sha256,
				content: Buffer.from(file.bytes),
				access: file.access,
				uploaded_by: analyst.id
			});
		}
		const [guest] = await trx('room_guests').insert({ email: spec.investor.email, name: spec.investor.name, password_hash: passwordHash }).returning(['id']);
		await trx('room_guest_access').insert({ room_id: room.id, guest_id: guest.id, invited_by: analyst.id, expires_at: new Date(Date.now() + 365 * 86_400_000) });
	});
}
