import { useId, type InputHTMLAttributes, type ReactNode, type SelectHTMLAttributes } from 'react';

// No focus:outline-none: the focused control keeps the app's focus outline (index.css), which a
// keyboard user can see; a 1 px border turning copper alone is too faint.
const control =
  'w-full rounded-md border bg-panel px-2.5 py-1.5 text-base text-ink placeholder:text-ink-faint focus:border-copper aria-[invalid=true]:border-fail';

interface FieldShellProps {
  label: string;
  hint?: string;
  error?: string;
  children: (ids: { id: string; describedBy?: string; invalid: boolean }) => ReactNode;
}

/** Label, control, hint and field error in one block; the error is read out with the control. */
export function FieldShell({ label, hint, error, children }: FieldShellProps) {
  const id = useId();
  const describedBy = [hint && `${id}-hint`, error && `${id}-err`].filter(Boolean).join(' ') || undefined;
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={id} className="text-sm font-semibold text-ink-soft">
        {label}
      </label>
      {children({ id, describedBy, invalid: Boolean(error) })}
      {hint && !error && (
        <p id={`${id}-hint`} className="text-xs text-ink-faint">
          {hint}
        </p>
      )}
      {error && (
        <p id={`${id}-err`} className="text-xs font-semibold text-fail" role="alert">
          ✕ {error}
        </p>
      )}
    </div>
  );
}

export function TextField({
  label,
  hint,
  error,
  className = '',
  ...rest
}: InputHTMLAttributes<HTMLInputElement> & { label: string; hint?: string; error?: string }) {
  return (
    <FieldShell label={label} hint={hint} error={error}>
      {({ id, describedBy, invalid }) => (
        <input id={id} aria-describedby={describedBy} aria-invalid={invalid} className={`${control} border-rule ${className}`} {...rest} />
      )}
    </FieldShell>
  );
}

export function SelectField({
  label,
  hint,
  error,
  options,
  className = '',
  ...rest
}: SelectHTMLAttributes<HTMLSelectElement> & {
  label: string;
  hint?: string;
  error?: string;
  options: { value: string; label: string }[];
}) {
  return (
    <FieldShell label={label} hint={hint} error={error}>
      {({ id, describedBy, invalid }) => (
        <select id={id} aria-describedby={describedBy} aria-invalid={invalid} className={`${control} border-rule ${className}`} {...rest}>
          {options.map((o) => (
            <option key={o.value} value={o.value}>
              {o.label}
            </option>
          ))}
        </select>
      )}
    </FieldShell>
  );
}
