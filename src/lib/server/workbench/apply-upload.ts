/**
 * Dropping an upload's parsed data into a scenario document: resources
 * (histograms, time series binned on upload, sea-state tables) replace
 * `resource`, power curves and power matrices replace `device`. The result is
 * a candidate document; the caller validates it against the scenario schema.
 */
import { uploadKindInfo, type UploadKind } from '../../schemas/workbench';
import type { Scenario } from '../../schemas/scenario';

export type ApplyUploadResult =
	| { ok: true; document: Record<string, unknown>; section: 'resource' | 'device' }
	| { ok: false; message: string };

/** A Te/Tp ratio the user set on the section being replaced outlives the upload's default. */
function keepTeOverTp(previous: unknown, next: Record<string, unknown>): Record<string, unknown> {
	const old = previous as { kind?: string; teOverTp?: number } | undefined;
	if (old && old.kind === next.kind && typeof old.teOverTp === 'number' && 'teOverTp' in next) {
		return { ...next, teOverTp: old.teOverTp };
	}
	return next;
}

export function applyUploadToDocument(document: Scenario, kind: UploadKind, data: unknown): ApplyUploadResult {
	const info = uploadKindInfo[kind];
	if (!info.technologies.includes(document.technology)) {
		return {
			ok: false,
			message: `A ${info.label.toLowerCase()} fits ${info.technologies.join(' or ')} scenarios; this scenario is ${document.technology}.`
		};
	}
	if (!data || typeof data !== 'object') return { ok: false, message: 'This upload holds no parsed data to apply.' };
	const fragment = keepTeOverTp(document[info.section], data as Record<string, unknown>);
	return { ok: true, document: { ...document, [info.section]: fragment }, section: info.section };
}
