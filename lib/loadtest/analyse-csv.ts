import type { ColumnMapping } from './columns';
import { analyseDyno, type DynoAnalysis, type DynoAnalysisOptions } from './dyno-analysis';
import { parseDynoCsv, type DynoImportResult, type DynoRun } from './dyno-import';
import type { LoadtestInput } from './text-input';

export type DynoCsvAnalysisResult =
  | { readonly status: 'ok'; readonly run: DynoRun; readonly analysis: DynoAnalysis }
  | Exclude<DynoImportResult, { status: 'ok' }>;

/** Import and analyse a dyno CSV in one call (what the upload route and the benchmark use). */
export function analyseDynoCsv(input: LoadtestInput, options: DynoAnalysisOptions & { mapping?: ColumnMapping | null }): DynoCsvAnalysisResult {
  const imported = parseDynoCsv(input, { mapping: options.mapping ?? null });
  if (imported.status !== 'ok') return imported;
  return { status: 'ok', run: imported.run, analysis: analyseDyno(imported.run, options) };
}
