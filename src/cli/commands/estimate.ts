/**
 * `compfit estimate --sales FILE.csv --subject FILE.json [--predictors a,b] [--transform none|log]
 * [--level 0.95] [--format json|text]`: reads both files, fits, prints the Result JSON or a
 * text summary. Every problem with the input is an InputError (exit 2) and nothing is printed
 * on stdout.
 */
import { readFile } from 'node:fs/promises';
import path from 'node:path';
import { EstimateError, runEstimate } from '../../domain/estimate.js';
import { estimateText } from '../../domain/estimate-text.js';
import { validateModel } from '../../domain/model.js';
import { describeRowError, readSalesCsv } from '../../domain/sales-csv.js';
import { parseSubject } from '../../domain/subject-json.js';
import { InputError, parseOptions, type Command } from '../cli-io.js';

async function readText(file: string, cwd: string, what: string): Promise<string> {
  try {
    return await readFile(path.resolve(cwd, file), 'utf8');
  } catch (err) {
    throw new InputError([`cannot read the ${what} file "${file}": ${(err as NodeJS.ErrnoException).code ?? (err as Error).message}`]);
  }
}

export const estimateCommand: Command = async (args, io) => {
  const { options, positional } = parseOptions(args, ['sales', 'subject', 'predictors', 'transform', 'level', 'format']);
  const problems: string[] = [];
  if (positional.length > 0) problems.push(`unexpected argument "${positional[0]}"`);
  if (!options.sales) problems.push('--sales FILE.csv is required');
  if (!options.subject) problems.push('--subject FILE.json is required');
  const format = options.format ?? 'json';
  if (format !== 'json' && format !== 'text') problems.push(`--format must be json or text, got "${format}"`);
  const level = options.level === undefined ? undefined : Number(options.level);
  if (options.level !== undefined && !/^\d*\.?\d+$/.test(options.level)) problems.push(`--level must be a number such as 0.95, got "${options.level}"`);
  const model = validateModel({
    predictors: options.predictors?.split(',').map((s) => s.trim()).filter(Boolean),
    transform: options.transform,
    level,
  });
  if (!model.ok) problems.push(...model.errors.map((e) => `--${e}`));
  if (problems.length > 0) throw new InputError(problems);
  if (!model.ok) return 2;

  const salesText = await readText(options.sales, io.cwd, 'sales');
  const subjectText = await readText(options.subject, io.cwd, 'subject');
  const csv = readSalesCsv(salesText);
  for (const notice of csv.notices) io.stderr(`compfit estimate: note: ${notice}\n`);
  if (!csv.ok) throw new InputError(csv.errors.map((e) => `${options.sales}: ${describeRowError(e)}`));

  let subjectJson: unknown;
  try {
    subjectJson = JSON.parse(subjectText);
  } catch (err) {
    throw new InputError([`${options.subject}: not valid JSON (${(err as Error).message})`]);
  }
  const subject = parseSubject(subjectJson);
  if (!subject.ok) throw new InputError(Object.values(subject.errors).map((m) => `${options.subject}: ${m}`));

  // Sales without an id of their own are numbered by their row, as the file shows them.
  const sales = csv.sales.map((s, i) => (s.id ? s : { ...s, id: `row ${i + 1}` }));
  let result;
  try {
    result = runEstimate(sales, subject.value, model.value);
  } catch (err) {
    if (err instanceof EstimateError) throw new InputError(err.problems);
    throw err;
  }
  io.stdout(format === 'json' ? JSON.stringify(result, null, 2) + '\n' : estimateText(result, subject.value.address));
  return 0;
};
