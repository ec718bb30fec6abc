import { useState } from 'react';
import { useDropzone } from 'react-dropzone';
import { NCR_ANSWER_ACCEPTED, NCR_ANSWER_MAX_BYTES, type NcrDetail } from '../../../../shared/api/supplier-quality.ts';
import { Button } from '../../../components/ui/button.tsx';
import { FieldShell } from '../../../components/ui/field.tsx';
import { Notice } from '../../../components/ui/notice.tsx';
import { ApiError } from '../../../lib/api-client.ts';
import { useRecordAnswer } from '../api/record-answer.ts';

const MB = 1024 * 1024;

/** Records the supplier's answer: its text and the document they sent (type checked by content on the server). */
export function AnswerForm({ ncr }: { ncr: NcrDetail }) {
  const [text, setText] = useState('');
  const [file, setFile] = useState<File | null>(null);
  const [refused, setRefused] = useState<string | null>(null);
  const record = useRecordAnswer();
  const err = record.error instanceof ApiError ? record.error : null;
  const { getRootProps, getInputProps, isDragActive } = useDropzone({
    multiple: false,
    maxSize: NCR_ANSWER_MAX_BYTES,
    onDrop: (accepted, rejected) => {
      setRefused(rejected.length ? (rejected[0]!.errors.some((e) => e.code === 'file-too-large') ? `larger than ${NCR_ANSWER_MAX_BYTES / MB} MB` : rejected[0]!.errors[0]!.message) : null);
      if (accepted[0]) setFile(accepted[0]);
    },
  });
  return (
    <form
      aria-label="Record the supplier's answer"
      className="flex flex-col gap-3"
      onSubmit={(e) => {
        e.preventDefault();
        if (file) record.mutate({ id: ncr.id, text, file });
      }}
    >
      <FieldShell label="Supplier's answer (root cause and corrective action)" error={err?.fieldError('text')}>
        {({ id, describedBy, invalid }) => (
          <textarea
            id={id}
            aria-describedby={describedBy}
            aria-invalid={invalid}
            rows={4}
            value={text}
            onChange={(e) => setText(e.target.value)}
            className="w-full rounded-md border border-rule bg-panel px-2.5 py-1.5 text-base text-ink aria-[invalid=true]:border-fail"
          />
        )}
      </FieldShell>
      <div
        {...getRootProps({ 'aria-label': 'Drop the answer document here or press Enter to choose it', 'data-testid': 'answer-dropzone' } as React.HTMLAttributes<HTMLElement>)}
        className={`cursor-pointer rounded-lg border-2 border-dashed px-4 py-5 text-center text-sm ${isDragActive ? 'border-copper bg-copper-light' : 'border-rule bg-paper hover:border-copper'}`}
      >
        <input {...getInputProps()} aria-label="Answer document" />
        <p className="font-semibold text-ink">{file ? `✓ ${file.name}` : isDragActive ? 'Drop to attach' : 'Drop the answer document here, or click to choose'}</p>
        <p className="mt-1 text-xs text-ink-soft">
          {NCR_ANSWER_ACCEPTED}, up to {NCR_ANSWER_MAX_BYTES / MB} MB. The type is read from the content. An answer is kept as recorded.
        </p>
      </div>
      {(refused || err?.fieldError('file')) && (
        <p className="text-xs font-semibold text-fail" role="alert">
          ✕ {refused ?? err?.problem.detail}
        </p>
      )}
      {record.isError && !err?.fieldError('file') && !err?.fieldError('text') && <Notice tone="fail">{(record.error as Error).message}</Notice>}
      <div>
        <Button type="submit" variant="primary" disabled={!file || text.trim().length < 3} busy={record.isPending}>
          Record answer
        </Button>
      </div>
    </form>
  );
}
