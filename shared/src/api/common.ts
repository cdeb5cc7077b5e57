/** The body of every 400 caused by invalid input: one list of messages per field path (e.g. `setup.alphaAxis.min`). */
export interface FieldErrorsBody {
  statusCode: 400;
  message: string;
  errors: Record<string, string[]>;
}

/** An error answer with a stable machine-readable `code` beside the human `message`. */
export interface ApiErrorBody {
  statusCode: number;
  code: string;
  message: string;
}

/** A person as other members of the same team see them in maps, pins and replies. */
export interface PersonRef {
  id: string;
  displayName: string;
}
