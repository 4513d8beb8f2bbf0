// Autosave of the sheet text in localStorage. Failures (storage full, storage switched off) are
// reported, never thrown; a stored sheet that no longer loads is kept aside under another key.

export const AUTOSAVE_KEY = 'strainsheet:autosave:v1'; // also read by web/app/demoSheet.ts
export const SET_ASIDE_PREFIX = 'strainsheet:autosave:unreadable:';

export type StoreOutcome = { ok: true } | { ok: false; message: string };

function storage(): Storage | null {
  try {
    return window.localStorage ?? null;
  } catch {
    return null;
  }
}

function isQuotaError(err: unknown): boolean {
  return err instanceof DOMException && (err.name === 'QuotaExceededError' || err.name === 'NS_ERROR_DOM_QUOTA_REACHED');
}

export function writeAutosave(text: string): StoreOutcome {
  const s = storage();
  if (!s) return { ok: false, message: 'Autosave is off: this browser does not allow local storage for this page.' };
  try {
    s.setItem(AUTOSAVE_KEY, text);
    return { ok: true };
  } catch (err) {
    if (isQuotaError(err)) {
      return { ok: false, message: `Autosave failed: local storage is full (sheet is ${Math.ceil(text.length / 1024)} kB). Save the sheet to a file.` };
    }
    return { ok: false, message: `Autosave failed: ${err instanceof Error ? err.message : String(err)}` };
  }
}

export interface RestoreResult<T> {
  /** The restored sheet, when there was a readable autosave. */
  sheet?: T;
  /** What the user should be told (unreadable autosave set aside, storage off, ...). */
  message?: string;
  /** False when the unreadable autosave could not be set aside: autosave must then stay off. */
  safeToWrite: boolean;
}

/** Reads the autosave with `parse` (which throws on a bad file). */
export function restoreAutosave<T>(parse: (text: string) => T): RestoreResult<T> {
  const s = storage();
  if (!s) return { message: 'Autosave is off: this browser does not allow local storage for this page.', safeToWrite: false };
  let text: string | null;
  try {
    text = s.getItem(AUTOSAVE_KEY);
  } catch (err) {
    return { message: `Autosave could not be read: ${err instanceof Error ? err.message : String(err)}`, safeToWrite: false };
  }
  if (text === null) return { safeToWrite: true };
  try {
    return { sheet: parse(text), safeToWrite: true };
  } catch (err) {
    const reason = err instanceof Error ? err.message : String(err);
    const aside = `${SET_ASIDE_PREFIX}${new Date().toISOString()}`;
    try {
      s.setItem(aside, text);
      // Set aside once: the next start finds no autosave instead of copying it again.
      s.removeItem(AUTOSAVE_KEY);
    } catch {
      return {
        message: `The autosaved sheet could not be read (${reason}) and there is no room to keep a copy; autosave is paused so it is not overwritten.`,
        safeToWrite: false,
      };
    }
    return { message: `The autosaved sheet could not be read (${reason}). It is kept in local storage under "${aside}"; the demo sheet is shown.`, safeToWrite: true };
  }
}
