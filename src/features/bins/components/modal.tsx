import { useEffect, useRef, type ReactNode } from 'react';

/** A modal form frame on the native <dialog>: focus stays inside, Escape closes. */
export function Modal({ title, open, onClose, children }: { title: string; open: boolean; onClose: () => void; children: ReactNode }) {
  const ref = useRef<HTMLDialogElement>(null);
  useEffect(() => {
    const d = ref.current;
    if (!d) return;
    if (open && !d.open) d.showModal?.();
    if (!open && d.open) d.close?.();
  }, [open]);
  if (!open) return null;
  return (
    <dialog
      ref={ref}
      aria-labelledby="bins-modal-title"
      onCancel={(e) => {
        e.preventDefault();
        onClose();
      }}
      className="m-auto w-[30rem] max-w-[94vw] rounded-lg border border-rule bg-panel p-5 text-ink shadow-xl backdrop:bg-ink/40"
    >
      <h2 id="bins-modal-title" className="mb-3 text-lg font-bold">
        {title}
      </h2>
      {children}
    </dialog>
  );
}
