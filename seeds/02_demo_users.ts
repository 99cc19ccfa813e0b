/**
 * Demo people, all invented: the Halvard Marine Energy team with one user per
 * role, the owner of a second workspace (Corvane Advisory) who must see
 * nothing of Halvard's, and a consultant: an analyst at Corvane Advisory whom
 * Halvard lets read its projects (a viewer there), so her portfolio spans two
 * workspaces. `npm start` prints these credentials.
 */
import type { Knex } from 'knex';
import { hash } from '@node-rs/argon2';
import { demoWorkspace } from './01_demo_workspace';

export const demoUsers = {
	owner: { email: 'isla.penrow@halvard-marine.example', name: 'Isla Penrow', password: 'kelp-harbour-owner-26', role: 'owner' },
	analyst: { email: 'tomas.vell@halvard-marine.example', name: 'Tomas Vell', password: 'slack-water-analyst-26', role: 'analyst' },
	viewer: { email: 'ada.quill@halvard-marine.example', name: 'Ada Quill', password: 'ebb-and-flow-viewer-26', role: 'viewer' },
	outsider: { email: 'bram.ostley@corvane-advisory.example', name: 'Bram Ostley', password: 'spring-neap-outsider-26', role: 'owner' },
	consultant: { email: 'wenna.strallis@corvane-advisory.example', name: 'Wenna Strallis', password: 'tide-table-consultant-26', role: 'analyst' }
} as const;

export type DemoPersona = keyof typeof demoUsers;

export const otherWorkspace = { name: 'Corvane Advisory', slug: 'corvane-advisory' };

export async function seed(knex: Knex): Promise<void> {
	const existing = await knex('users').count<{ count: string }[]>({ count: '*' });
	if (Number(existing[0].count) > 0) return;
	const halvard = await knex('workspaces').select('id').where({ slug: demoWorkspace.slug }).first();
	if (!halvard) return;

	const hashes = await Promise.all(
		Object.values(demoUsers).map((u) => hash(u.password, { memoryCost: 19_456, timeCost: 2, parallelism: 1 }))
	);
	await knex.transaction(async (trx) => {
		const [corvane] = await trx('workspaces').insert(otherWorkspace).returning(['id']);
		const people = Object.values(demoUsers);
		for (const [index, person] of people.entries()) {
			const [user] = await trx('users')
				.insert({ email: person.email, name: person.name, password_hash: hashes[index], email_verified_at: trx.fn.now() })
				.returning(['id']);
			const workspaceId = person === demoUsers.outsider || person === demoUsers.consultant ? corvane.id : halvard.id;
			await trx('memberships').insert({ workspace_id: workspaceId, user_id: user.id, role: person.role });
			if (person === demoUsers.consultant) await trx('memberships').insert({ workspace_id: halvard.id, user_id: user.id, role: 'viewer' });
		}
	});
}
