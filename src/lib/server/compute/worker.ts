/**
 * The work the compute pool (./pool.ts) runs on its worker threads: the
 * engine, the upload parsers, the export builder and the PDF summary, each
 * a named task.
 * Everything that crosses the thread boundary is plain data (the engine's
 * public results carry decimals as strings).
 *
 * An engine refusal of its input (a RangeError) comes back as a value, not a
 * thrown error, so the request thread can answer it in the same words as
 * before (runEngine in ../workbench/evaluation.ts).
 *
 * This module is only ever imported dynamically, never statically: the build
 * then keeps it as a file of its own whose address it reports itself
 * (`tasksFileUrl`), and the worker threads load that file.
 */
import { evaluateScenario, type EngineResult } from '../engine/evaluate';
import { spider as spiderOf, tornado as tornadoOf, type DriverId, type DriverRange, type SpiderSeries, type TornadoResult } from '../engine/sensitivity';
import { UPLOAD_KINDS, type UploadResult } from '../uploads';
import { buildExport as buildExportFile, type CsvTableName, type ExportFile, type ExportFormat } from '../workbench/export';
import type { ExportContext } from '../workbench/export-tables';
import type { ScenarioSummaryInput } from '../pdf/summary';
import type { MetricKey } from '../../metrics/catalogue';
import type { Scenario } from '../../schemas/scenario';
import type { UploadKind } from '../../schemas/workbench';

/** Where this module's code lives once built (or in the sources under Vite and vitest). */
export const tasksFileUrl: string = import.meta.url;

export type TaskOutcome<T> = { ok: true; value: T } | { ok: false; engineRefusal: string };

async function guarded<T>(compute: () => T | Promise<T>): Promise<TaskOutcome<T>> {
	try {
		return { ok: true, value: await compute() };
	} catch (e) {
		if (e instanceof RangeError) return { ok: false, engineRefusal: e.message };
		throw e;
	}
}

export type SpiderAnswer = { metric: MetricKey; unit: string; series: SpiderSeries[]; warnings: string[] };

export const TASKS = {
	evaluate: (input: { document: Scenario }): Promise<TaskOutcome<EngineResult>> => guarded(() => evaluateScenario(input.document)),

	tornado: (input: { document: Scenario; drivers: readonly DriverRange[]; metric: MetricKey }): Promise<TaskOutcome<TornadoResult>> =>
		guarded(() => tornadoOf(input.document, input.drivers, input.metric)),

	spider: (input: { document: Scenario; drivers: readonly DriverId[]; metric: MetricKey; changes?: readonly number[] }): Promise<TaskOutcome<SpiderAnswer>> =>
		guarded(() => spiderOf(input.document, input.drivers, input.metric, input.changes)),

	parseUpload: (input: { kind: UploadKind; bytes: Uint8Array }): Promise<TaskOutcome<UploadResult<unknown, unknown>>> =>
		guarded(() => UPLOAD_KINDS[input.kind].parse(input.bytes)),

	buildExport: (input: { result: EngineResult; context: ExportContext; format: ExportFormat; table: CsvTableName }): Promise<TaskOutcome<ExportFile>> =>
		guarded(() => buildExportFile(input.result, input.context, input.format, input.table)),

	// Not guarded: the engine has already run, so a RangeError here is a fault in drawing (a 500), never a refusal of the input.
	// pdfkit and its font parser load only where a summary is drawn, on first use.
	summaryPdf: async (input: { summary: ScenarioSummaryInput }): Promise<TaskOutcome<Uint8Array<ArrayBuffer>>> => {
		const { renderScenarioSummaryPdf } = await import('../pdf/summary');
		return { ok: true, value: new Uint8Array(await renderScenarioSummaryPdf(input.summary)) };
	}
};

export type TaskName = keyof typeof TASKS;
export type TaskInput<N extends TaskName> = Parameters<(typeof TASKS)[N]>[0];
export type TaskValue<N extends TaskName> = Awaited<ReturnType<(typeof TASKS)[N]>> extends TaskOutcome<infer T> ? T : never;
export type TaskMessage = { [N in TaskName]: { task: N; input: TaskInput<N> } }[TaskName];

/** The one entry point the pool calls (a single export, so the build's naming cannot lose it). */
export function runTask(message: TaskMessage): Promise<TaskOutcome<unknown>> {
	const task = TASKS[message.task] as (input: unknown) => Promise<TaskOutcome<unknown>>;
	if (!task) throw new Error(`No compute task named "${String(message.task)}".`);
	return task(message.input);
}
