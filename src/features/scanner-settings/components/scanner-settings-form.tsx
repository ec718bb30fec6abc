import { useState, type FormEvent } from 'react';
import type { ScannerSettingsResponse } from '../../../../shared/api/settings.ts';
import { Button } from '../../../components/ui/button.tsx';
import { TextField } from '../../../components/ui/field.tsx';
import { Loading } from '../../../components/ui/page.tsx';
import { Notice } from '../../../components/ui/notice.tsx';
import { ApiError } from '../../../lib/api-client.ts';
import { useScannerSettings } from '../api/get-scanner-settings.ts';
import { useUpdateScannerSettings } from '../api/update-scanner-settings.ts';

const split = (s: string) => s.split(/\s+/).filter(Boolean);

function Editor({ data }: { data: ScannerSettingsResponse }) {
  const [form, setForm] = useState({
    gs: data.configured.gs.join(' '),
    rs: data.configured.rs.join(' '),
    eot: data.configured.eot.join(' '),
    purchaseOrderPattern: data.configured.purchaseOrderPattern ?? '',
  });
  const [saved, setSaved] = useState(false);
  const mutation = useUpdateScannerSettings();
  const err = mutation.error instanceof ApiError ? mutation.error : null;
  const fieldErr = (k: string) => err?.problem.errors?.filter((e) => e.field === k || e.field.startsWith(`${k}[`)).map((e) => e.message).join('; ') || undefined;
  const set = (k: keyof typeof form) => (e: { target: { value: string } }) => {
    setSaved(false);
    setForm((f) => ({ ...f, [k]: e.target.value }));
  };
  const submit = (e: FormEvent) => {
    e.preventDefault();
    mutation.mutate(
      { gs: split(form.gs), rs: split(form.rs), eot: split(form.eot), purchaseOrderPattern: form.purchaseOrderPattern.trim() || null },
      { onSuccess: () => setSaved(true) },
    );
  };
  return (
    <form onSubmit={submit} noValidate aria-label="Scanner settings" className="grid gap-3">
      <p className="text-sm text-ink-soft">
        Built in: GS as {data.defaults.gs.join(' ')}; RS as {data.defaults.rs.join(' ')}; EOT as {data.defaults.eot.join(' ')}. Add what your scanners send instead, separated by spaces.
      </p>
      <div className="grid gap-3 sm:grid-cols-3">
        <TextField label="Extra for GS" value={form.gs} onChange={set('gs')} error={fieldErr('gs')} />
        <TextField label="Extra for RS" value={form.rs} onChange={set('rs')} error={fieldErr('rs')} />
        <TextField label="Extra for EOT" value={form.eot} onChange={set('eot')} error={fieldErr('eot')} />
      </div>
      <TextField
        label="Purchase-order pattern (regular expression)"
        hint={`Empty: ${data.defaults.purchaseOrderPattern}`}
        value={form.purchaseOrderPattern}
        onChange={set('purchaseOrderPattern')}
        error={fieldErr('purchaseOrderPattern')}
      />
      {err && !err.problem.errors?.length && <Notice tone="fail">{err.problem.detail}</Notice>}
      {saved && <Notice tone="pass" title="Scanner settings saved">Labels are read with them from now on.</Notice>}
      <div>
        <Button type="submit" busy={mutation.isPending}>
          Save scanner settings
        </Button>
        {data.updatedAt && (
          <span className="ml-3 text-xs text-ink-faint">
            Last changed {new Date(data.updatedAt).toLocaleString()} by {data.updatedBy ?? 'unknown'}
          </span>
        )}
      </div>
    </form>
  );
}

/** Quality engineers set the separator substitutes the site's keyboard-wedge scanners send. */
export function ScannerSettingsForm() {
  const q = useScannerSettings();
  if (q.isLoading) return <Loading />;
  if (q.isError || !q.data) return <Notice tone="fail" title="Scanner settings could not be loaded">{(q.error as Error | null)?.message}</Notice>;
  return <Editor data={q.data} />;
}
