/**
 * The document a new scenario starts from when none is sent: the example
 * scenario of the project's technology (examples/*.json, bundled at build
 * time), renamed and set in the project's currency and at the project's site.
 */
import type { Technology } from '../../schemas/workbench';

const examples = import.meta.glob<Record<string, unknown>>('/examples/*.json', { eager: true, import: 'default' });

/** The example each technology starts from (see starterDocument), by technology, in the examples' order. */
function starterExample(technology: Technology): Record<string, unknown> | undefined {
	return Object.keys(examples)
		.sort()
		.map((path) => examples[path])
		// A lender's case on an assessed energy is no starting point for a design: the first example that computes its energy.
		.find((doc) => doc.technology === technology && (doc.resource as { kind?: unknown } | undefined)?.kind !== 'assessed-energy');
}

type ExampleFacts = { name: string; siteName: string; siteDescription: string; currency: string };

/** What a project started from an example is called and priced in. */
function factsOf(example: Record<string, unknown>): ExampleFacts {
	const site = (example.site ?? {}) as { name?: string };
	const siteName = site.name ?? '';
	return {
		name: `${siteName || String(example.name)} (example)`,
		siteName,
		siteDescription: typeof example.description === 'string' ? example.description : '',
		currency: typeof example.currency === 'string' ? example.currency : 'EUR'
	};
}

/** What a project started from a technology's example is called and priced in, without copying its document. */
export function exampleProjectFacts(technology: Technology): ExampleFacts | undefined {
	const example = starterExample(technology);
	return example ? factsOf(example) : undefined;
}

/** A whole project to start from, per technology: the example's site, currency and document (an empty workspace offers them). */
export function exampleProject(technology: Technology): (ExampleFacts & { document: Record<string, unknown> }) | undefined {
	const example = starterExample(technology);
	return example ? { ...factsOf(example), document: { ...structuredClone(example), name: 'Base case' } } : undefined;
}

export function starterDocument(
	technology: Technology,
	options: { name: string; currency: string; siteName: string }
): Record<string, unknown> | undefined {
	const example = starterExample(technology);
	if (!example) return undefined;
	const copy = structuredClone(example);
	const site = { ...(copy.site as Record<string, unknown> | undefined), name: options.siteName || undefined };
	return { ...copy, site, name: options.name, currency: options.currency, description: `Started from the example "${String(example.name)}".` };
}
