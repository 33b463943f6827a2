/**
 * `gicladder design`, `header` and `netlist`: design from a file and write the outputs. Every output is
 * rendered in memory first, so a design or rendering error writes nothing; each file is then written
 * atomically (temporary file and rename), and the header only when its content changed.
 */
import { join } from 'node:path';
import { designFilter, designPlots, toCHeader, toJsonReport, toResponseCsv, toSpiceNetlist, type FilterDesign } from '../spec/index';
import { writeAtomic, writeIfChanged } from './atomic-write';
import { cautionFor } from './caution';
import { readJsonFile } from './spec-file';
import { designSummary } from './summary';
import type { CliIo } from './io';
import { productionOutputs, type ProductionOutputs } from '../spec/production-outputs';

/** A file stem from the design name: letters, digits, '-' and '_' only, never empty. */
export function fileStem(name: string): string {
  const stem = name.replace(/[^A-Za-z0-9_-]+/g, '_').replace(/^[_-]+|[_-]+$/g, '').slice(0, 64);
  return stem || 'filter';
}

export interface RenderedOutputs {
  readonly design: FilterDesign;
  readonly production: ProductionOutputs | null;
  /** File name (relative to the output folder) -> content. */
  readonly files: Readonly<Record<string, string>>;
}

/** Designs and renders every output of `gicladder design`. */
export function renderDesignOutputs(spec: unknown, onProgress?: (done: number, total: number) => void): RenderedOutputs {
  const design = designFilter(spec);
  const stem = fileStem(design.spec.name);
  const production = productionOutputs(design, onProgress);
  const plots = designPlots(design, production?.plotExtras ?? {});
  const files: Record<string, string> = {
    'report.json': toJsonReport(design, production?.report ?? {}),
    [`${stem}.h`]: toCHeader(design, production?.headerExtras ?? {}),
    [`${stem}.cir`]: toSpiceNetlist(design),
    [`${stem}-response.csv`]: toResponseCsv(design),
  };
  if (production) files[`${stem}-montecarlo.csv`] = production.monteCarloCsv;
  for (const [kind, svg] of Object.entries(plots)) files[`${stem}-${kind}.svg`] = svg;
  return { design, production, files };
}

export function runDesignCommand(specPath: string, options: { out?: string }, io: CliIo, onProgress?: (done: number, total: number) => void): number {
  const spec = readJsonFile(specPath);
  const rendered = renderDesignOutputs(spec, onProgress);
  const outDir = options.out ?? 'out';
  const caution = cautionFor(rendered.design.spec);
  if (caution) io.stderr(`${caution}\n\n`);
  const written: string[] = [];
  for (const [name, content] of Object.entries(rendered.files)) {
    const path = join(outDir, name);
    if (name.endsWith('.h')) writeIfChanged(path, content);
    else writeAtomic(path, content);
    written.push(path);
  }
  io.stdout(designSummary(rendered.design));
  if (rendered.production) io.stdout(rendered.production.summary);
  io.stdout(`\nwrote:\n${written.map((p) => `  ${p}`).join('\n')}\n`);
  return 0;
}

/** `gicladder header`: the C header alone, to a file (rewritten only if changed) or stdout. */
export function runHeaderCommand(specPath: string, options: { output?: string }, io: CliIo): number {
  const design = designFilter(readJsonFile(specPath));
  const caution = cautionFor(design.spec);
  if (caution) io.stderr(`${caution}\n\n`);
  const production = productionOutputs(design);
  const header = toCHeader(design, production?.headerExtras ?? {});
  if (options.output) {
    const changed = writeIfChanged(options.output, header);
    io.stderr(`${options.output}: ${changed ? 'written' : 'unchanged'}\n`);
  } else io.stdout(header);
  return 0;
}

/** `gicladder netlist`: the SPICE netlist alone. */
export function runNetlistCommand(specPath: string, options: { output?: string }, io: CliIo): number {
  const design = designFilter(readJsonFile(specPath));
  const caution = cautionFor(design.spec);
  if (caution) io.stderr(`${caution}\n\n`);
  const netlist = toSpiceNetlist(design);
  if (options.output) writeAtomic(options.output, netlist);
  else io.stdout(netlist);
  return 0;
}
