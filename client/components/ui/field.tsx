import { forwardRef, useId, type InputHTMLAttributes, type ReactNode, type SelectHTMLAttributes, type TextareaHTMLAttributes } from "react";

interface FieldProps {
  label: ReactNode;
  /** Shown under the control; the error, when present, takes its place. */
  hint?: ReactNode;
  error?: string | undefined;
  className?: string;
  children: (control: { id: string; "aria-invalid": boolean; "aria-describedby": string | undefined }) => ReactNode;
}

/** Label, control, hint and error wired together for screen readers (aria-describedby, aria-invalid). */
export function Field({ label, hint, error, className = "", children }: FieldProps) {
  const id = useId();
  const noteId = `${id}-note`;
  const hasNote = Boolean(error || hint);
  return (
    <div className={`flex flex-col gap-1 ${className}`}>
      <label htmlFor={id} className="text-sm font-semibold text-ink">
        {label}
      </label>
      {children({ id, "aria-invalid": Boolean(error), "aria-describedby": hasNote ? noteId : undefined })}
      {error ? (
        <p id={noteId} role="alert" className="text-sm text-brick">
          {error}
        </p>
      ) : hint ? (
        <p id={noteId} className="text-xs text-ink-faint">
          {hint}
        </p>
      ) : null}
    </div>
  );
}

const controlClass =
  "w-full rounded border border-paper-edge bg-white/70 px-2 py-1.5 text-[0.95rem] text-ink placeholder:text-ink-faint focus:border-sea aria-[invalid=true]:border-brick";

export const TextInput = forwardRef<HTMLInputElement, InputHTMLAttributes<HTMLInputElement>>(function TextInput({ className = "", ...rest }, ref) {
  return <input ref={ref} className={`${controlClass} ${className}`} {...rest} />;
});

interface TextAreaProps extends TextareaHTMLAttributes<HTMLTextAreaElement> {
  /** Formulas and TeX read best in a monospaced face; prose does not. */
  mono?: boolean;
}

export const TextArea = forwardRef<HTMLTextAreaElement, TextAreaProps>(function TextArea({ className = "", mono = true, ...rest }, ref) {
  return <textarea ref={ref} className={`${controlClass} ${mono ? "font-mono text-sm" : ""} ${className}`} {...rest} />;
});

export const Select = forwardRef<HTMLSelectElement, SelectHTMLAttributes<HTMLSelectElement>>(function Select({ className = "", ...rest }, ref) {
  return <select ref={ref} className={`${controlClass} ${className}`} {...rest} />;
});
