/**
 * A study the report has no special section for (one added later): any JSON file with a
 * `candidates` list and a `recommended` entry. Shown as its recommendation, its budget
 * fields and a compact table of its candidates' scalar fields.
 */
import { dataTable, html, keyValueTable, type Cell, type Html } from './html.ts';
import { isObject, isRecommended, list, obj, scalarFields, studyVerdict, valueText, type ReportStudy } from './study-data.ts';

/** Names of top-level fields that state a budget or a setting of the study. */
const BUDGET_FIELD = /budget|target|size|limit|tolerance|basis|levels|ratio|frequency/i;
/** The most columns and rows of the candidate table. */
const MAX_COLUMNS = 9;
const MAX_ROWS = 80;

/**
 * The generic study section.
 *
 * @example
 * genericSection({ file: 'staircase.json', folder: 'out', data: { recommended: null, candidates: [] } });
 */
export function genericSection(s: ReportStudy): Html {
  const d = s.data;
  const rec = obj(d, 'recommended');
  const top = scalarFields(isObject(d) ? d : null).filter(([k]) => !k.includes('.'));
  const budget = top.filter(([k]) => BUDGET_FIELD.test(k));
  const shownTop = budget.length ? budget : top;
  const candidates = list(d, 'candidates');
  const columns: string[] = [];
  for (const c of candidates.slice(0, 200)) {
    for (const [k] of scalarFields(isObject(c) ? c : null)) if (!columns.includes(k)) columns.push(k);
  }
  const shownColumns = columns.slice(0, MAX_COLUMNS);
  const rows = candidates.slice(0, MAX_ROWS).map((c): Cell[] => {
    const values = new Map(scalarFields(isObject(c) ? c : null));
    const picked = isRecommended(c, rec);
    return [
      ...shownColumns.map((k): Cell => ({ value: valueText(values.get(k)), numeric: typeof values.get(k) === 'number' })),
      picked ? 'recommended' : '',
    ];
  });
  const left = [
    columns.length > MAX_COLUMNS ? `${columns.length - MAX_COLUMNS} more columns` : '',
    candidates.length > MAX_ROWS ? `${candidates.length - MAX_ROWS} more rows` : '',
  ].filter(Boolean);
  return html`<p class="verdict"><strong>${studyVerdict(s)}</strong></p>
<p class="note">This report has no dedicated section for this study; its recommendation, budget and candidates are shown as the file gives them.</p>
${rec ? html`<h3>Recommended</h3>${keyValueTable(scalarFields(rec).map(([k, v]) => [k, valueText(v)] as const))}` : ''}
<h3>${budget.length ? 'Budget' : 'Settings'}</h3>
${shownTop.length ? keyValueTable(shownTop.map(([k, v]) => [k, valueText(v)] as const)) : html`<p class="note">The file states no budget.</p>`}
<h3>Candidates</h3>
${candidates.length ? dataTable([...shownColumns, ''], rows, 'data compact', candidates.slice(0, MAX_ROWS).map((c) => isRecommended(c, rec))) : html`<p class="note">No candidates in the file.</p>`}
${left.length ? html`<p class="note">${left.join(' and ')} in ${s.file}.</p>` : ''}`;
}
