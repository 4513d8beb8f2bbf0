// The app's chunk workers load each job kind on first use (web/jobs/webJobKinds.ts): the table
// must give exactly the jobs src/jobs/jobKinds.ts registers (independent list: the registry).
import { describe, expect, it } from 'vitest';
import { registerJobKinds } from '../../src/jobs/jobKinds';
import { chunkedJobOf } from '../../src/jobs/chunkedJob';
import { loadJobKind, WEB_JOB_KINDS } from '../../web/jobs/webJobKinds';

describe("the app's job kinds loaded on first use", () => {
  it('gives, for each kind, the job the command line registers, and no other kinds', async () => {
    registerJobKinds();
    for (const kind of Object.keys(WEB_JOB_KINDS)) expect(await loadJobKind(kind)).toBe(chunkedJobOf(kind));
    // The registry's kinds, as its own error message lists them.
    let known = '';
    try {
      chunkedJobOf('no such kind');
    } catch (e) {
      known = /\(known: (.*)\)/.exec((e as Error).message)?.[1] ?? '';
    }
    const registered = known.split(', ');
    expect(Object.keys(WEB_JOB_KINDS).sort()).toEqual(registered.sort());
    await expect(loadJobKind('nothing')).rejects.toThrow(/unknown parallel job kind nothing/);
  });
});
