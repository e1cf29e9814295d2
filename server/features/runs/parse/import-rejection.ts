/**
 * A file that cannot become a run. `message` is a sentence a runner understands and is sent as
 * the `error` of the file's entry in `rejected` (api-contract.md); `code` is for programs.
 */
export class ImportRejection extends Error {
  readonly code: string;

  constructor(code: string, message: string) {
    super(message);
    this.name = 'ImportRejection';
    this.code = code;
  }
}
