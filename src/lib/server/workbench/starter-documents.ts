/**
 * The document a new scenario starts from when none is sent: the example
 * scenario of the project's technology (examples/*.json, bundled at build
 * time), renamed and set in the project's currency and at the project's site.
 */
import type { Technology } from '../../schemas/workbench';

const examples = import.meta.glob<Record<string, unknown>>('/examples/*.json', { eager: true, import: 'default' });

export function starterDocument(
	technology: Technology,
	options: { name: string; currency: string; siteName: string }
): Record<string, unknown> | undefined {
	const example = Object.keys(examples)
		.sort()
		.map((path) => examples[path])
		// A lender's case on an assessed energy is no starting point for a design: the first example that computes its energy.
		.find((doc) => doc.technology === technology && (doc.resource as { kind?: unknown } | undefined)?.kind !== 'assessed-energy');
	if (!example) return undefined;
	const copy = structuredClone(example);
	const site = { ...(copy.site as Record<string, unknown> | undefined), name: options.siteName || undefined };
	return { ...copy, site, name: options.name, currency: options.currency, description: `Started from the example "${String(example.name)}".` };
}
