import { describe, expect, it } from 'vitest';
import { ProjectReadCache } from './project-read-cache';

const projectA = 'aaaaaaaa-0000-4000-8000-000000000001';
const projectB = 'bbbbbbbb-0000-4000-8000-000000000002';

function counter(projectId: string) {
	let reads = 0;
	return {
		load: async () => ({ projectId, read: ++reads }),
		get reads() {
			return reads;
		}
	};
}

const ofProject = (value: { projectId: string }) => value.projectId;

describe('ProjectReadCache', () => {
	it('hands a kept read out again without loading it', async () => {
		const cache = new ProjectReadCache(10, () => true);
		const a = counter(projectA);
		expect(await cache.read('a', a.load, ofProject)).toEqual({ projectId: projectA, read: 1 });
		expect(await cache.read('a', a.load, ofProject)).toEqual({ projectId: projectA, read: 1 });
		expect(a.reads).toBe(1);
	});

	it('forgets the entries of a changed project only', async () => {
		const cache = new ProjectReadCache(10, () => true);
		const a = counter(projectA);
		const b = counter(projectB);
		await cache.read('a', a.load, ofProject);
		await cache.read('b', b.load, ofProject);
		cache.forgetProject(projectA);
		expect((await cache.read('a', a.load, ofProject))?.read).toBe(2);
		expect((await cache.read('b', b.load, ofProject))?.read).toBe(1);
		cache.forgetAll();
		expect((await cache.read('b', b.load, ofProject))?.read).toBe(2);
	});

	it('does not keep a read that was under way when a change was announced', async () => {
		const cache = new ProjectReadCache(10, () => true);
		let release!: () => void;
		const slow = new Promise<void>((resolve) => (release = resolve));
		const pending = cache.read(
			'a',
			async () => {
				await slow;
				return { projectId: projectA, read: 'before the change' };
			},
			ofProject
		);
		// The change commits while the read is on its way back: its answer may predate it.
		cache.forgetProject(projectB);
		release();
		expect((await pending)?.read).toBe('before the change');
		const a = counter(projectA);
		expect((await cache.read('a', a.load, ofProject))?.read).toBe(1);
	});

	it('neither hands out nor keeps anything while it may not be used', async () => {
		let usable = true;
		const cache = new ProjectReadCache(10, () => usable);
		const a = counter(projectA);
		await cache.read('a', a.load, ofProject);
		usable = false;
		expect((await cache.read('a', a.load, ofProject))?.read).toBe(2);
		expect((await cache.read('a', a.load, ofProject))?.read).toBe(3);
		usable = true;
		// The entry kept before is still there: whoever made it unusable forgets what must go.
		expect((await cache.read('a', a.load, ofProject))?.read).toBe(1);
	});

	it('keeps nothing for a read that found nothing', async () => {
		const cache = new ProjectReadCache(10, () => true);
		let reads = 0;
		const missing = async () => {
			reads++;
			return undefined;
		};
		await cache.read('gone', missing, ofProject);
		await cache.read('gone', missing, ofProject);
		expect(reads).toBe(2);
		expect(cache.size).toBe(0);
	});

	it('lets the least recently used entry go when full', async () => {
		const cache = new ProjectReadCache(2, () => true);
		const loads = { a: counter(projectA), b: counter(projectA), c: counter(projectA) };
		await cache.read('a', loads.a.load, ofProject);
		await cache.read('b', loads.b.load, ofProject);
		await cache.read('a', loads.a.load, ofProject); // a is now the most recently used
		await cache.read('c', loads.c.load, ofProject); // b goes
		expect(cache.size).toBe(2);
		await cache.read('a', loads.a.load, ofProject);
		await cache.read('b', loads.b.load, ofProject);
		expect(loads.a.reads).toBe(1);
		expect(loads.b.reads).toBe(2);
	});

	it('freezes what it keeps, deeply, so no reader can change it for the next', async () => {
		const cache = new ProjectReadCache(10, () => true);
		const value = await cache.read('a', async () => ({ projectId: projectA, rows: [{ name: 'first' }] }), ofProject);
		expect(() => {
			(value!.rows[0] as { name: string }).name = 'changed';
		}).toThrow(TypeError);
		expect(() => value!.rows.push({ name: 'more' })).toThrow(TypeError);
	});
});
