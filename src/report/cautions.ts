/**
 * The cautions every summary carries, in plain words (issue 11: what a
 * rejection means, what a non-rejection does not mean, the nearly-sharp
 * caveat, the density caveat, and the evaluator's judgement): the one wording
 * of each, for the summary sheet, the reports and the command line.
 *
 * @example CAUTION.judgement // 'This summary informs, and does not replace, …'
 */
export const CAUTION = {
  rejection:
    'A rejection by the outcome–treatment test means the data contradict the assumptions that make the effect for compliers meaningful (that crossing the cutoff changes outcomes only through treatment, and that nobody is pushed out of treatment by eligibility); look at the implied complier distributions to see where.',
  notProof:
    'A test that does not reject is not proof that the design is valid: it only finds no contradiction in these data, and small samples or small violations may go unnoticed.',
  nearlySharp:
    'When take-up barely changes at the cutoff, or is nearly 0 or 1 on both sides (a nearly sharp design), the effect for compliers is imprecise and the test has little room to detect a violation.',
  density:
    'A jump in the density of the score is evidence of sorting around the cutoff, not proof of an invalid design (sorting unrelated to outcomes leaves the estimand intact); a smooth density is no proof of validity.',
  judgement: 'This summary informs, and does not replace, the judgement of a qualified evaluator.',
} as const;

/** All of them, in the order a summary lists them. */
export const CAUTIONS: readonly string[] = [CAUTION.rejection, CAUTION.notProof, CAUTION.nearlySharp, CAUTION.density, CAUTION.judgement];
