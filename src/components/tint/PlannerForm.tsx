import type { SubmitEventHandler, ReactNode } from 'react';

interface Props {
  /** The form's accessible name. */
  label: string;
  onSubmit: SubmitEventHandler<HTMLFormElement>;
  submit: string;
  /** The button's words while the request runs. */
  busyLabel: string;
  /** The form's state: submitting, and its root error (the API's message, or the first of the form's own). */
  state: { isSubmitting: boolean; errors: { root?: { message?: string } } };
  /** The fields. */
  children: ReactNode;
  /** What the planner found, beside the form (below it on a phone). */
  answer: ReactNode;
}

/** A planner's form and its answer side by side: the fields, the button, the error, then the answer. */
export function PlannerForm({ label, onSubmit, submit, busyLabel, state, children, answer }: Props) {
  const error = state.errors.root?.message;
  return (
    <div className="grid gap-6 lg:grid-cols-[minmax(0,2fr)_minmax(0,3fr)]">
      <form className="card grid content-start gap-4" onSubmit={onSubmit} noValidate aria-label={label}>
        {children}
        <button className="btn btn-primary" type="submit" disabled={state.isSubmitting}>
          {state.isSubmitting ? busyLabel : submit}
        </button>
        {error && (
          <div className="alert alert-error" role="alert">
            {error}
          </div>
        )}
      </form>

      <div aria-live="polite">{answer}</div>
    </div>
  );
}
