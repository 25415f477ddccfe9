// The one way a form shows what is wrong with a field: a marked line under it, tied to the
// control by aria-describedby (the control's id + "-error").
export function fieldErrorId(controlId: string): string {
  return `${controlId}-error`;
}

export function FieldError({ controlId, message }: { controlId: string; message?: string }) {
  if (!message) return null;
  return (
    <p
      id={fieldErrorId(controlId)}
      className="flex items-start gap-1.5 text-caption font-medium text-danger"
    >
      <span aria-hidden="true">▲</span>
      {message}
    </p>
  );
}

/** An error that belongs to a group of fields (a fieldset, a list), announced when it appears. */
export function GroupError({ message }: { message?: string }) {
  if (!message) return null;
  return (
    <p role="alert" className="flex items-start gap-1.5 text-caption font-medium text-danger">
      <span aria-hidden="true">▲</span>
      {message}
    </p>
  );
}
