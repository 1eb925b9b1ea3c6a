/**
 * One labelled form field with its unit beside the input and its error message beside
 * it, linked by aria-describedby so screen readers read the error with the field.
 */
import type { Child } from 'hono/jsx';

export interface FieldProps {
  name: string;
  label: string;
  value?: string;
  error?: string;
  unit?: string;
  type?: 'text' | 'date' | 'search';
  inputmode?: 'decimal' | 'numeric' | 'text';
  required?: boolean;
  hint?: string;
  multiline?: boolean;
  maxlength?: number;
  autofocus?: boolean;
}

export function Field(p: FieldProps) {
  const id = `f-${p.name}`;
  const described = [p.error ? `${id}-error` : '', p.hint ? `${id}-hint` : ''].filter(Boolean).join(' ') || undefined;
  const common = {
    id,
    name: p.name,
    'aria-invalid': p.error ? 'true' : undefined,
    'aria-describedby': described,
    required: p.required,
    maxlength: p.maxlength,
    autofocus: p.autofocus,
  };
  return (
    <div class={`field${p.error ? ' has-error' : ''}`}>
      <label for={id}>
        {p.label}
        {p.required ? <span class="required" aria-hidden="true"> *</span> : null}
      </label>
      <div class="control">
        {p.multiline ? (
          <textarea {...common} rows={3}>
            {p.value ?? ''}
          </textarea>
        ) : (
          <input {...common} type={p.type ?? 'text'} inputmode={p.inputmode} value={p.value ?? ''} />
        )}
        {p.unit !== undefined ? <span class="unit">{p.unit}</span> : null}
      </div>
      {p.hint ? (
        <p class="hint" id={`${id}-hint`}>
          {p.hint}
        </p>
      ) : null}
      {p.error ? (
        <p class="error" id={`${id}-error`}>
          {p.error}
        </p>
      ) : null}
    </div>
  );
}

export function ErrorSummary(props: { errors: Record<string, string>; children?: Child }) {
  const n = Object.keys(props.errors).length;
  if (n === 0) return null;
  return (
    <div class="error-summary" role="alert">
      <p>
        {n === 1 ? 'One field needs attention' : `${n} fields need attention`}; nothing was saved.
      </p>
      {props.children}
    </div>
  );
}
