/**
 * Errors of the encoders and training stage. Each carries a stable `code` (listed in
 * docs/training.md); messages say what was expected, what was found, and how to fix it.
 */
export type TrainingErrorCode =
  | 'plugin-not-found' // the plugin module path does not exist
  | 'plugin-load-failed' // importing the module threw
  | 'plugin-bad-export' // the module has no `createEncoder` function export
  | 'plugin-factory-failed' // the factory (or its apply) threw
  | 'plugin-bad-output' // apply returned the wrong shape or no tensor
  | 'encoder-needs-images' // conv encoder on a dataset without imageShape
  | 'engine-unavailable' // train.engine names an engine that cannot run here
  | 'dataset-too-short' // no episode has two steps, or too few samples for a fit
  | 'embeddings-missing' // method 'precomputed' without a path or with an unreadable file
  | 'embeddings-shape' // precomputed embeddings do not line up with the episodes
  | 'representation-file' // a saved representation is missing or malformed
  | 'training-aborted'; // the runner stopped the job

/** An error with a stable code; `where` names the file, path or index involved. */
export class TrainingError extends Error {
  readonly code: TrainingErrorCode;
  readonly where: string | undefined;

  constructor(code: TrainingErrorCode, message: string, where?: string) {
    super(where === undefined ? message : `${where}: ${message}`);
    this.name = 'TrainingError';
    this.code = code;
    this.where = where;
  }
}
