/** The caution every estimate, results page and worksheet carries (DESIGN.md "The cautions"). */
export const CAUTION_TITLE = 'A statistical indication, not an appraisal';

export const CAUTION_TEXT =
  'This figure is a statistical indication computed from recorded sales. It is not an appraisal and does not replace ' +
  'the judgement of a licensed or certified appraiser. The standards and laws where the property lies govern any ' +
  'opinion of value (in the United States, USPAP and state licensing law). Verify every sale and characteristic before relying on it.';
