import { useId, useState } from 'react';
import type { RosterResult } from '@rinkwright/core';
import { Button } from '../../../components/ui/button';
import { Alert } from '../../../components/ui/feedback';
import { ApiError } from '../../../lib/api-client';
import { useImportRoster } from '../api/import-roster';

const lineNumber = (field: string) => Number(/^line (\d+)$/.exec(field)?.[1] ?? Number.MAX_SAFE_INTEGER);

function resultWords(r: RosterResult): string {
  if (!r.applied) return 'This exact file was imported before; nothing changed.';
  return `${r.rows} row${r.rows === 1 ? '' : 's'} imported: ${r.teamsCreated} team${r.teamsCreated === 1 ? '' : 's'} created, ${r.playersAdded} player${r.playersAdded === 1 ? '' : 's'} added, ${r.customersCreated} new customer record${r.customersCreated === 1 ? '' : 's'}.`;
}

/** Reads the roster file in the browser and sends its text; the server applies every row or none. */
export function RosterUpload({ slug, leagueId }: { slug: string; leagueId: string }) {
  const id = useId();
  const upload = useImportRoster(slug, leagueId);
  const [file, setFile] = useState<File | null>(null);
  const [done, setDone] = useState<RosterResult | null>(null);
  const [problem, setProblem] = useState<{ message: string; lines: [string, string][] } | null>(null);

  async function send() {
    if (!file) return;
    setDone(null);
    setProblem(null);
    try {
      setDone(await upload.mutateAsync(await file.text()));
    } catch (error) {
      const lines =
        error instanceof ApiError && error.fields
          ? Object.entries(error.fields)
              .sort(([a], [b]) => lineNumber(a) - lineNumber(b))
              .map(([field, messages]): [string, string] => [field === 'csv' ? 'File' : field.replace(/^line/, 'Line'), messages.join(' ')])
          : [];
      setProblem({ message: error instanceof Error ? error.message : 'The roster was not imported', lines });
    }
  }

  return (
    <form className="space-y-3" aria-label="Upload a roster" onSubmit={(e) => (e.preventDefault(), void send())}>
      <p className="text-sm">
        A CSV file whose first line is <code className="rounded bg-glacier px-1 font-mono">team,name,email,phone</code>, then one line per player with an e-mail, a phone
        or both. New team names make new teams; a player already on the roster moves to the team the file names. Every line is checked first: if one is wrong, nothing is
        imported. Importing the same file again changes nothing.
      </p>
      <div>
        <label htmlFor={id} className="block text-sm font-semibold">
          Roster file
        </label>
        <input
          id={id}
          type="file"
          accept=".csv,text/csv"
          className="mt-1 block min-h-11 w-full rounded-lg border border-rule bg-white px-3 py-2 text-base"
          onChange={(e) => {
            setFile(e.target.files?.[0] ?? null);
            setDone(null);
            setProblem(null);
          }}
        />
      </div>
      {done ? <Alert tone="success">{resultWords(done)}</Alert> : null}
      {problem ? (
        <div role="alert" className="rounded-lg border-l-4 border-brick bg-red-50 px-4 py-3 text-sm text-brick">
          <p className="font-bold">{problem.message}</p>
          {/nothing was imported/i.test(problem.message) ? null : <p>Nothing was imported.</p>}
          {problem.lines.some(([where]) => where.startsWith('Line')) ? <p>Fix these lines in the file and import it again. The header is line 1.</p> : null}
          {problem.lines.length > 0 ? (
            <ul className="mt-2 list-disc space-y-1 pl-5">
              {problem.lines.map(([where, message]) => (
                <li key={where}>
                  <span className="font-semibold">{where}:</span> {message}
                </li>
              ))}
            </ul>
          ) : null}
        </div>
      ) : null}
      <Button type="submit" disabled={!file || upload.isPending} busy={upload.isPending}>
        {upload.isPending ? 'Importing…' : 'Import roster'}
      </Button>
    </form>
  );
}
