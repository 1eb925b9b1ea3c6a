/** The caution of DESIGN.md "The cautions", shown in the footer of every page. */
export const CAUTION_TEXT =
  'compfit gives a statistical indication drawn from recorded sales. It is not an appraisal and does not replace the ' +
  'judgement of a licensed or certified appraiser. The standards and laws where the property lies govern (in the ' +
  'United States, USPAP and state licensing law). Verify every sale and characteristic before relying on it.';

export function Caution() {
  return (
    <p class="caution" role="note">
      <strong>Caution.</strong> {CAUTION_TEXT}
    </p>
  );
}
