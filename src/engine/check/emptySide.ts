/**
 * Messages for a calculation left with no rows (or no rows on one side of the
 * cutoff) by missing values: they name the columns whose missing values did
 * it, with counts, rather than blame the cutoff. Example: with an outcome
 * "bill" missing on all 40 rows whose score is below the cutoff 60, the
 * message reads "no row below the cutoff 60 has a value in every column the
 * estimates need: of the 40 rows with a score below it, 40 miss "bill"
 * (outcome); …".
 */
import type { CheckInput, DataColumn } from './check';

interface Mask {
  name: string;
  role: string;
  missing?: Uint8Array;
}

function masks(input: CheckInput, outcome: DataColumn | undefined, withCells: boolean): Mask[] {
  const list: Mask[] = [
    { name: input.score.name, role: 'score', missing: input.score.missing },
    { name: input.treated.name, role: 'treated', missing: input.treated.missing },
  ];
  if (outcome) list.push({ name: outcome.name, role: 'outcome', missing: outcome.missing });
  if (input.cluster) list.push({ name: input.cluster.name, role: 'cluster', missing: input.cluster.missing });
  if (withCells && input.within) list.push({ name: input.within.name, role: 'cells of the validity test', missing: input.within.missing });
  return list;
}

const REMEDY = 'fill in the missing values, or check that these are the intended columns';

function describe(counts: Array<[Mask, number]>): string {
  return counts
    .filter(([, k]) => k > 0)
    .sort((a, b) => b[1] - a[1])
    .map(([m, k]) => `${k} miss ${JSON.stringify(m.name)} (${m.role})`)
    .join(', ');
}

/** No row complete in every column a calculation needs. */
export function noRowMessage(input: CheckInput, outcome: DataColumn | undefined, withCells: boolean, donut?: Uint8Array): string {
  const n = input.score.values.length;
  const list = masks(input, outcome, withCells);
  const counts = list.map((m): [Mask, number] => {
    let k = 0;
    if (m.missing) for (let i = 0; i < n; i++) k += m.missing[i];
    return [m, k];
  });
  const full = counts.find(([, k]) => k === n);
  if (full) {
    return `the column ${JSON.stringify(full[0].name)} (${full[0].role}) is missing on every one of its ${n} rows; ${REMEDY}`;
  }
  let inDonut = 0;
  if (donut) for (let i = 0; i < n; i++) inDonut += donut[i];
  const donutPart = inDonut > 0 ? `; ${inDonut} lie inside the donut` : '';
  return `no row has a value in every column the estimates need: of the ${n} rows, ${describe(counts)}${donutPart}; ${REMEDY}`;
}

/**
 * Undefined when the score itself has no value on that side (then the cutoff
 * is at fault); else the message naming the columns that emptied the side.
 */
export function emptySideMessage(
  input: CheckInput,
  outcome: DataColumn | undefined,
  cutoff: number,
  below: boolean,
  donut?: Uint8Array,
): string | undefined {
  const n = input.score.values.length;
  const list = masks(input, outcome, false).slice(1);
  const counts = list.map((m): [Mask, number] => [m, 0]);
  let onSide = 0;
  for (let i = 0; i < n; i++) {
    if (input.score.missing?.[i] || donut?.[i]) continue;
    const r = input.score.values[i];
    if (below ? !(r < cutoff) : !(r >= cutoff)) continue;
    onSide++;
    for (const c of counts) if (c[0].missing?.[i]) c[1]++;
  }
  if (onSide === 0) return undefined;
  const where = below ? 'below' : 'at or above';
  return (
    `no row ${where} the cutoff ${cutoff} has a value in every column the estimates need: ` +
    `of the ${onSide} rows with a score ${where} it, ${describe(counts)}; ${REMEDY}`
  );
}
