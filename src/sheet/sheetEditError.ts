// Thrown by Sheet edits that cannot be made (an invalid or taken name, a missing cell). The UI shows
// `message`; `reason` and `suggestion` come from the name check when a name was refused.

export class SheetEditError extends Error {
  readonly reason: string;
  readonly suggestion?: string;
  constructor(message: string, reason?: string, suggestion?: string) {
    super(message);
    this.name = 'SheetEditError';
    this.reason = reason ?? message;
    if (suggestion !== undefined) this.suggestion = suggestion;
  }
}
