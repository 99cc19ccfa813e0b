/**
 * The editor's results: the draft is sent to the evaluate route a moment
 * after the last edit; the last good results stay on screen, marked as
 * updating, until the answer to the newest draft arrives. Answers to older
 * drafts are dropped, whatever order they come back in.
 */
import type { EngineResult } from '$lib/server/engine/evaluate';
import { callApi, type ApiIssue } from './api-client';

export type { EngineResult };

interface EvaluateAnswer {
	scenarioId: string;
	revision: number;
	source: 'draft' | 'saved';
	result: EngineResult;
}

export const EVALUATE_DELAY_MS = 400;

export class LiveResults {
	result = $state<EngineResult | null>(null);
	/** Evaluated at a revision of the saved scenario, or from the draft. */
	source = $state<'draft' | 'saved' | null>(null);
	updating = $state(false);
	/** Why the newest draft has no results (bad fields, engine refusal, network). */
	problem = $state<string | null>(null);
	issues = $state<ApiIssue[]>([]);

	#sequence = 0;
	#timer: ReturnType<typeof setTimeout> | undefined;
	#inFlight: AbortController | undefined;

	constructor(private readonly scenarioId: string) {}

	/** Evaluate `document` after the pause (a draft), or the saved scenario at once when `document` is undefined. */
	request(document: unknown, delayMs = EVALUATE_DELAY_MS) {
		const ticket = ++this.#sequence;
		clearTimeout(this.#timer);
		this.updating = true;
		this.#timer = setTimeout(() => void this.#send(ticket, document), document === undefined ? 0 : delayMs);
	}

	async #send(ticket: number, document: unknown) {
		this.#inFlight?.abort();
		const controller = new AbortController();
		this.#inFlight = controller;
		let answer;
		try {
			answer = await callApi<EvaluateAnswer>('POST', `/api/v1/scenarios/${this.scenarioId}/evaluate`, document === undefined ? undefined : { document }, {
				signal: controller.signal
			});
		} catch {
			return; // aborted: a newer draft is on its way
		}
		if (ticket !== this.#sequence) return;
		this.updating = false;
		if (answer.ok) {
			this.result = answer.body.result;
			this.source = answer.body.source;
			this.problem = null;
			this.issues = [];
		} else {
			this.problem = answer.message;
			this.issues = answer.issues;
		}
	}

	stop() {
		clearTimeout(this.#timer);
		this.#inFlight?.abort();
	}
}
