import type { FormFields } from '../../shared/forms/field-labels';

/** Each key of a field's API body (new field, and the field page's details) and its box, by its label. */
export const FIELD_FORM_FIELDS: FormFields = {
  name: { control: 'name', label: 'Field name' },
  notes: { control: 'notes', label: 'Notes' },
  // Drawn on the map, not typed in a box: a refusal names it above the form.
  boundary: { control: 'boundary', label: 'Boundary' },
};
