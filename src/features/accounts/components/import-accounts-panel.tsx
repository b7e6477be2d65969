import { useId, useState } from 'react';
import { Link } from 'react-router-dom';
import { accountFileColumnHelp, accountFileColumns, MAX_IMPORT_BYTES, type ImportIssue } from '@shared/schemas/csv';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { FormAlert, inputClasses } from '@/components/ui/form-field';
import { StatusBadge } from '@/components/ui/status-badge';
import { DetailedApiError } from '@/features/fleet/api/raw-request';
import { formatBytes } from '@/features/fleet/lib/labels';
import { useImportAccountsMutation, type ImportReport } from '../api/import-accounts';

/**
 * CSV import of accounts and contacts in two steps: a preview that lists every bad line (with its
 * line number, column and reason) and writes nothing, then an all-or-nothing import of the file.
 */
export function ImportAccountsPanel({ open, onClose, onImported }: { open: boolean; onClose: () => void; onImported: (report: ImportReport) => void }) {
  return (
    <Dialog open={open} onClose={onClose} variant="panel" title="Import accounts from CSV" description="One row per contact; rows of the same account share its columns.">
      {open && <ImportBody onClose={onClose} onImported={onImported} />}
    </Dialog>
  );
}

function ImportBody({ onClose, onImported }: { onClose: () => void; onImported: (report: ImportReport) => void }) {
  const fileId = useId();
  const importer = useImportAccountsMutation();
  const [file, setFile] = useState<{ name: string; text: string } | null>(null);
  const [report, setReport] = useState<ImportReport | null>(null);
  const [problem, setProblem] = useState<string | null>(null);

  const run = (mode: 'preview' | 'commit', csv: string) => {
    setProblem(null);
    importer.mutate(
      { csv, mode },
      {
        onSuccess: (result) => {
          if (mode === 'commit') onImported(result);
          else setReport(result);
        },
        onError: (error) => {
          // A refused commit carries the same line list as a preview.
          if (error instanceof DetailedApiError && Array.isArray(error.details.errors)) {
            setReport((current) => (current ? { ...current, ok: false, errors: error.details.errors as ImportIssue[] } : current));
          }
          setProblem(error.message);
        },
      },
    );
  };

  const choose = async (chosen: File | undefined) => {
    setReport(null);
    setProblem(null);
    setFile(null);
    if (!chosen) return;
    if (chosen.size > MAX_IMPORT_BYTES) {
      setProblem(`${chosen.name} is ${formatBytes(chosen.size)}: an import file may be at most ${formatBytes(MAX_IMPORT_BYTES)}.`);
      return;
    }
    const text = await chosen.text();
    setFile({ name: chosen.name, text });
    run('preview', text);
  };

  return (
    <div className="space-y-5">
      <div>
        <label htmlFor={fileId} className="mb-1 block font-semibold text-ink-900">
          CSV file
        </label>
        <input id={fileId} type="file" accept=".csv,text/csv" className={inputClasses} onChange={(e) => void choose(e.target.files?.[0])} />
        <p className="mt-1 text-sm text-loam-700">UTF-8, comma-separated, with a header row. Nothing is saved until you confirm the import.</p>
      </div>

      {importer.isPending && <p role="status">{report ? 'Importing…' : 'Checking the file…'}</p>}
      {problem && <FormAlert>{problem}</FormAlert>}

      {report && file && (
        <section aria-labelledby="import-preview-title" className="space-y-4">
          <h3 id="import-preview-title" className="text-lg font-bold text-ink-900">
            Preview of {file.name}
          </h3>
          <p className="flex flex-wrap items-center gap-3">
            {report.ok ? (
              <StatusBadge tone="good" shape="dot">Ready to import</StatusBadge>
            ) : (
              <StatusBadge tone="bad" shape="cross">{`${report.summary.badLines} ${report.summary.badLines === 1 ? 'line has' : 'lines have'} problems`}</StatusBadge>
            )}
            <span className="tabular">
              {plural(report.summary.lines, 'line')} · {plural(report.summary.accounts, 'account')} · {plural(report.summary.contacts, 'contact')}
            </span>
          </p>
          {report.errors.length > 0 && <IssueTable caption="Problems to fix (nothing will be imported until every line is right)" issues={report.errors} tone="bad" />}
          {report.warnings.length > 0 && <IssueTable caption="Warnings (the file can still be imported)" issues={report.warnings} tone="soon" />}
          {report.ok && report.rows.length > 0 && (
            <div className="overflow-x-auto rounded-lg border border-loam-200">
              <table className="w-full text-left text-sm">
                <caption className="px-3 py-2 text-left font-semibold text-ink-900">What will be created</caption>
                <thead className="bg-loam-100">
                  <tr>
                    <th scope="col" className="px-3 py-2">Line</th>
                    <th scope="col" className="px-3 py-2">Account</th>
                    <th scope="col" className="px-3 py-2">Territory</th>
                    <th scope="col" className="px-3 py-2">Contact</th>
                  </tr>
                </thead>
                <tbody className="divide-y divide-loam-200">
                  {report.rows.slice(0, 50).map((row) => (
                    <tr key={row.line}>
                      <td className="px-3 py-1.5 tabular">{row.line}</td>
                      <td className="px-3 py-1.5">{row.account?.name}</td>
                      <td className="px-3 py-1.5">{row.account?.territoryName}</td>
                      <td className="px-3 py-1.5">{row.contact?.name ?? <span className="text-loam-700">—</span>}</td>
                    </tr>
                  ))}
                </tbody>
              </table>
              {report.rows.length > 50 && <p className="px-3 py-2 text-sm text-loam-700">…and {report.rows.length - 50} more lines.</p>}
            </div>
          )}
          <div className="flex flex-wrap gap-3 border-t border-loam-200 pt-4">
            {report.ok ? (
              <Button busy={importer.isPending} onClick={() => run('commit', file.text)}>
                Import {report.summary.accounts} {report.summary.accounts === 1 ? 'account' : 'accounts'} and {report.summary.contacts} {report.summary.contacts === 1 ? 'contact' : 'contacts'}
              </Button>
            ) : (
              <Button variant="secondary" busy={importer.isPending} onClick={() => run('preview', file.text)}>
                Check the same file again
              </Button>
            )}
            <Button variant="secondary" onClick={onClose}>
              Cancel
            </Button>
          </div>
        </section>
      )}

      <details className="rounded-lg border border-loam-200 p-3">
        <summary className="min-h-9 cursor-pointer font-semibold text-ink-800">Columns of the file</summary>
        <dl className="mt-2 space-y-2 text-sm">
          {accountFileColumns.map((column) => (
            <div key={column}>
              <dt className="font-mono font-semibold text-ink-900">{column}</dt>
              <dd className="text-loam-800">{accountFileColumnHelp[column]}</dd>
            </div>
          ))}
        </dl>
        <p className="mt-3 text-sm text-loam-800">
          Tip: an export from the <Link to="/accounts" className="underline">account list</Link> has exactly these columns.
        </p>
      </details>
    </div>
  );
}

const plural = (n: number, word: string) => `${n} ${n === 1 ? word : `${word}s`}`;

function IssueTable({ caption, issues, tone }: { caption: string; issues: ImportIssue[]; tone: 'bad' | 'soon' }) {
  return (
    <div className={tone === 'bad' ? 'overflow-x-auto rounded-lg border-2 border-brick-300' : 'overflow-x-auto rounded-lg border border-amber-300'}>
      <table className="w-full text-left text-sm">
        <caption className={tone === 'bad' ? 'px-3 py-2 text-left font-semibold text-brick-800' : 'px-3 py-2 text-left font-semibold text-amber-800'}>{caption}</caption>
        <thead className="bg-loam-100">
          <tr>
            <th scope="col" className="px-3 py-2">Line</th>
            <th scope="col" className="px-3 py-2">Column</th>
            <th scope="col" className="px-3 py-2">Reason</th>
          </tr>
        </thead>
        <tbody className="divide-y divide-loam-200">
          {issues.map((issue, i) => (
            <tr key={`${issue.line}-${issue.column}-${i}`}>
              <td className="px-3 py-1.5 font-semibold tabular">{issue.line}</td>
              <td className="px-3 py-1.5 font-mono">{issue.column ?? '—'}</td>
              <td className="px-3 py-1.5">{issue.message}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
