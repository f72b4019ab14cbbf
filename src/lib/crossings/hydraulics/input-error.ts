/**
 * The error every function of the hydraulics core throws for input it cannot use. It names the
 * input (`field`, as the caller spelt it) so an endpoint can answer 422 with `{ fields }`, and its
 * message says what was expected in words a person can act on.
 */
export class HydraulicsInputError extends RangeError {
  /**
   * @param field - the input at fault, e.g. `runoffCoefficient`, `section.stationsM`
   * @param message - what is wrong and what to enter instead
   */
  constructor(
    readonly field: string,
    message: string,
  ) {
    super(message);
    this.name = 'HydraulicsInputError';
  }
}
