/**
 * The production-test part of the outputs (test points and limits, trim table) for a design whose
 * design file asks for them. Until the production stage is wired into the pipeline this returns null.
 */
import type { FilterDesign } from '../spec/index';
import type { HeaderExtras, PlotExtras } from '../spec/index';

export interface ProductionOutputs {
  readonly headerExtras: HeaderExtras;
  readonly plotExtras: PlotExtras;
  readonly report: Record<string, unknown>;
  readonly summary: string;
}

export function productionOutputs(_design: FilterDesign, _onProgress?: (done: number, total: number) => void): ProductionOutputs | null {
  return null;
}
