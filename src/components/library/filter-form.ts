/**
 * The island's hold on the page's plain GET filter form (LibraryFilters.astro): read its fields,
 * and set them to match a view when the island changes it (a header sort, the back button).
 */

export const FILTER_FORM_ID = 'library-filters';

export const filterForm = (): HTMLFormElement | null => document.getElementById(FILTER_FORM_ID) as HTMLFormElement | null;

export function readFields(form: HTMLFormElement): [string, string][] {
  return [...new FormData(form)].map(([key, value]) => [key, typeof value === 'string' ? value : '']);
}

/** Sets every named field to `values` (a field left out is cleared); hidden fields are left alone. */
export function writeFields(form: HTMLFormElement, values: Record<string, string>): void {
  for (const element of Array.from(form.elements)) {
    if (!(element instanceof HTMLInputElement || element instanceof HTMLSelectElement) || !element.name) continue;
    const value = values[element.name] ?? '';
    if (element instanceof HTMLInputElement && element.type === 'hidden') continue;
    if (element instanceof HTMLInputElement && element.type === 'checkbox') element.checked = value !== '';
    else element.value = value;
  }
}

/** Marks the field the API refused with `aria-invalid` (none: clears the mark). */
export function markRefused(form: HTMLFormElement, name: string | undefined): void {
  for (const element of Array.from(form.elements)) {
    if (!(element instanceof HTMLInputElement || element instanceof HTMLSelectElement)) continue;
    if (name && element.name === name) element.setAttribute('aria-invalid', 'true');
    else element.removeAttribute('aria-invalid');
  }
}

/** A field's label as the form shows it, so a message can read "Highest temperature: …" rather than name the parameter. */
export function fieldLabel(form: HTMLFormElement, name: string): string | undefined {
  const element = form.elements.namedItem(name);
  if (!(element instanceof HTMLInputElement || element instanceof HTMLSelectElement)) return undefined;
  return element.getAttribute('aria-label') ?? element.labels?.[0]?.textContent?.trim() ?? undefined;
}
