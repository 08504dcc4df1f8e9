import { FormControl } from '@angular/forms';
import { requiredText } from './required-text';

describe('requiredText', () => {
  it('refuses an empty or spaces-only text as required, and takes any text with a letter in it', () => {
    const errorOf = (v: string | null) => new FormControl(v, { validators: [requiredText] }).errors;
    expect(errorOf('')).toEqual({ required: true });
    expect(errorOf('   \t ')).toEqual({ required: true });
    expect(errorOf(null)).toEqual({ required: true });
    expect(errorOf(' North Quarter ')).toBeNull();
  });
});
