import { DomainError } from '../http';

/** What is wrong with an uploaded elevation model; the message says it in words. */
export type ElevationModelProblem =
  | 'not-tiff'
  | 'truncated'
  | 'damaged'
  | 'too-large'
  | 'not-single-band'
  | 'unsupported-sample-type'
  | 'unsupported-compression'
  | 'no-georeferencing'
  | 'not-north-up'
  | 'missing-crs'
  | 'unknown-crs'
  | 'unsupported-crs'
  | 'crs-conflict'
  | 'all-nodata';

/**
 * An elevation model that cannot be used, with a message a person can act on (what is wrong with
 * the file, what to do). Status 422; the message is also given as the field `file`.
 */
export class ElevationModelError extends DomainError {
  constructor(
    readonly problem: ElevationModelProblem,
    message: string,
  ) {
    super(422, message, { file: message });
  }
}
