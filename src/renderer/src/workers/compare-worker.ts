// Design variants compared here, off the window's thread: the steady results of every variant on one
// speed range, or each variant's scenario simulated (its load-step metrics), one variant at a time with
// progress. Cancel = the window terminates this worker.
/// <reference lib="webworker" />
import { loadProject, type ResolvedProject } from '../../../core/project/project';
import { resolveVariants } from '../../../core/project/variant-overrides';
import { comparisonSpeedMax, variantLoadSteps, variantSteady, type VariantInput } from '../../../core/reports/variant-comparison';
import { InputError, isInputError } from '../../../core/base/errors';
import type { CompareReply, CompareRequest, CompareSource } from './compare-protocol';

const post = (msg: CompareReply) => (self as unknown as DedicatedWorkerGlobalScope).postMessage(msg);

/** A source's project: the file itself, or its named variant. */
function projectOf(s: CompareSource): ResolvedProject {
  const loaded = loadProject(s.projectText);
  if (s.variant === null) return loaded.resolved;
  const v = resolveVariants(loaded.file).find((x) => x.name === s.variant);
  if (!v) throw new InputError('variants', `has no variant named '${s.variant}'`);
  return v.project;
}

self.onmessage = (ev: MessageEvent<CompareRequest>) => {
  const req = ev.data;
  const t0 = performance.now();
  let current = '';
  try {
    const variants: VariantInput[] = req.sources.map((s) => {
      current = s.name;
      return { name: s.name, project: projectOf(s) };
    });
    current = '';
    if (req.kind === 'steady') {
      const top = comparisonSpeedMax(variants);
      const steady = variants.map((v, i) => {
        current = v.name;
        post({ kind: 'progress', fraction: i / variants.length });
        return variantSteady(v, top);
      });
      post({ kind: 'done', steady, loads: null, compute_ms: performance.now() - t0 });
    } else {
      const loads = variants.map((v, i) => {
        current = v.name;
        post({ kind: 'progress', fraction: i / variants.length });
        return variantLoadSteps(v);
      });
      post({ kind: 'done', steady: null, loads, compute_ms: performance.now() - t0 });
    }
  } catch (e) {
    const where = current ? `${current}: ` : '';
    post({ kind: 'error', message: where + (isInputError(e) ? e.message : `the comparison stopped: ${e instanceof Error ? e.message : String(e)}`) });
  }
};
