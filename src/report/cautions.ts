/**
 * The cautions every summary carries, in plain words (issue 11: what a
 * rejection means, what a non-rejection does not mean, the nearly-sharp
 * caveat, the density caveat, and the evaluator's judgement).
 */
export const CAUTIONS: readonly string[] = [
  'A rejection by the outcome–treatment test means the data contradict the assumptions that make the effect for compliers meaningful (that crossing the cutoff changes outcomes only through treatment, and that nobody is pushed out of treatment by eligibility); look at the implied complier distributions to see where.',
  'A test that does not reject is not proof that the design is valid: it only finds no contradiction in these data, and small samples or small violations may go unnoticed.',
  'When take-up barely changes at the cutoff, or is nearly 0 or 1 on both sides (a nearly sharp design), the effect for compliers is imprecise and the test has little room to detect a violation.',
  'A jump in the density of the score is evidence of sorting around the cutoff, not proof of an invalid design (sorting unrelated to outcomes leaves the estimand intact); a smooth density is no proof of validity.',
  'This summary informs, and does not replace, the judgement of a qualified evaluator.',
];
