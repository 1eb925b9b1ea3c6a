/**
 * Reads the estimate page's one form (model + subject, sent by GET so a result has a URL)
 * into a validated model, the raw subject fields to show again, and the subject when it
 * was asked for and valid. Field errors are a name → message map shown beside each input.
 */
import { PREDICTORS, type Predictor } from '../../domain/estimate-result.js';
import { DEFAULT_MODEL, PREDICTOR_SOURCE, validateModel, type ModelSpec } from '../../domain/model.js';
import { CHARACTERISTICS, type Subject } from '../../domain/sale.js';
import { parseSubject } from '../../domain/subject-json.js';

export const LEVELS = [0.8, 0.9, 0.95, 0.99] as const;
export const DEFAULT_GRID_SIZE = 6;

export interface EstimateInput {
  model: ModelSpec;
  modelErrors: string[];
  /** Raw subject fields as typed (for re-display). */
  subjectFields: Record<string, string>;
  /** The subject, when the form asked for an estimate and every field checks out. */
  subject?: Subject;
  subjectErrors: Record<string, string>;
  gridSize: number;
  /** True when the user asked for an estimate (pressed the estimate button or sent subject fields). */
  wantsEstimate: boolean;
  /** Show every sale in the diagnostics table, not only the flagged and the largest residuals. */
  allDiagnostics: boolean;
}

export const SUBJECT_FIELDS = ['address', 'effective_date', ...CHARACTERISTICS] as const;

export function readEstimateInput(params: URLSearchParams | Record<string, string | string[]>, today: string): EstimateInput {
  const all = (name: string): string[] => {
    if (params instanceof URLSearchParams) return params.getAll(name);
    const v = params[name];
    return v === undefined ? [] : Array.isArray(v) ? v : [v];
  };
  const one = (name: string) => all(name)[0];
  const chosen = all('predictors').flatMap((p) => p.split(',')).map((p) => p.trim()).filter(Boolean);
  const hasModel = chosen.length > 0 || one('transform') !== undefined || one('level') !== undefined;
  const levelText = one('level');
  const modelResult = validateModel({
    predictors: hasModel ? chosen : DEFAULT_MODEL.predictors,
    transform: one('transform') ?? DEFAULT_MODEL.transform,
    level: levelText === undefined ? DEFAULT_MODEL.level : Number(levelText),
  });
  const model = modelResult.ok ? modelResult.value : DEFAULT_MODEL;
  const modelErrors = modelResult.ok ? [] : modelResult.errors;

  const subjectFields: Record<string, string> = {};
  for (const f of SUBJECT_FIELDS) subjectFields[f] = (one(f) ?? '').trim();
  if (!subjectFields.effective_date) subjectFields.effective_date = today;
  const wantsEstimate = one('run') === 'estimate' || CHARACTERISTICS.some((c) => subjectFields[c] !== '');
  const gridText = one('grid');
  const gridSize = gridText && /^\d+$/.test(gridText) ? Math.min(50, Math.max(1, Number(gridText))) : DEFAULT_GRID_SIZE;

  let subject: Subject | undefined;
  let subjectErrors: Record<string, string> = {};
  if (wantsEstimate) {
    const json: Record<string, string> = {};
    for (const [k, v] of Object.entries(subjectFields)) if (v !== '') json[k] = v;
    const parsed = parseSubject(json);
    subjectErrors = parsed.ok ? {} : { ...parsed.errors };
    for (const p of model.predictors) {
      const source = PREDICTOR_SOURCE[p];
      if (source && subjectFields[source] === '' && !subjectErrors[source])
        subjectErrors[source] = `${source.replace(/_/g, ' ')} is needed by the model (${p})`;
    }
    if (parsed.ok && Object.keys(subjectErrors).length === 0) subject = parsed.value;
  }
  return { model, modelErrors, subjectFields, subject, subjectErrors, gridSize, wantsEstimate, allDiagnostics: one('diagnostics') === 'all' };
}

/** The query string that reproduces a model and subject (links, "back" after leaving a sale out). */
export function estimateQuery(model: ModelSpec, subjectFields: Record<string, string>, gridSize: number, run = true): string {
  const q = new URLSearchParams();
  for (const p of model.predictors) q.append('predictors', p);
  q.set('transform', model.transform);
  q.set('level', String(model.level));
  for (const [k, v] of Object.entries(subjectFields)) if (v) q.set(k, v);
  if (gridSize !== DEFAULT_GRID_SIZE) q.set('grid', String(gridSize));
  if (run) q.set('run', 'estimate');
  return q.toString();
}

export const PREDICTOR_CHOICES: { name: Predictor; label: string }[] = PREDICTORS.map((name) => ({
  name,
  label:
    name === 'living_area^2'
      ? 'Living area squared (curved price–size relation)'
      : name === 'months_since_sale'
        ? 'Months since sale (market conditions)'
        : name.replace(/_/g, ' ').replace(/^./, (ch) => ch.toUpperCase()),
}));
