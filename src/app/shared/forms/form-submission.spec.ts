import { FormControl, FormGroup, Validators } from '@angular/forms';
import { TestBed } from '@angular/core/testing';
import { Subject, throwError } from 'rxjs';
import { ApiError } from '../../core/http/api-error';
import type { FormFields } from './field-labels';
import { FormSubmission } from './form-submission';

describe('FormSubmission', () => {
  const form = () =>
    new FormGroup({
      name: new FormControl('', { nonNullable: true, validators: [Validators.required] }),
      width: new FormControl<number | null>(12, { validators: [Validators.min(0.01)] }),
    });
  const FIELDS: FormFields = {
    name: { control: 'name', label: 'Name' },
    widthM: { control: 'width', label: 'Working width' },
  };
  const make = (f: FormGroup, failure?: (err: unknown) => string | null) =>
    TestBed.runInInjectionContext(() => new FormSubmission(f, FIELDS, failure));

  it('when the form has a problem, then it is not ready, the box is marked, the message names its label and it stays blocked until fixed', () => {
    const f = form();
    const s = make(f);
    expect(s.blocked()).toBe(false);
    expect(s.ready()).toBe(false);
    expect(f.controls.name.touched).toBe(true);
    expect(s.error()).toBe('Check Name.');
    expect(s.blocked()).toBe(true);
    f.controls.width.setValue(0);
    expect(s.ready()).toBe(false);
    expect(s.error()).toBe('Check Name and Working width.');
    f.controls.name.setValue('North Section');
    expect(s.blocked()).toBe(true);
    f.controls.width.setValue(12);
    expect(s.blocked()).toBe(false);
    expect(s.error()).toBeNull();
    expect(s.ready()).toBe(true);
  });

  it('when a request runs, then it is busy until the answer and not ready twice', () => {
    const f = form();
    f.controls.name.setValue('North Section');
    const s = make(f);
    const answer = new Subject<string>();
    const done = jest.fn();
    s.send(answer, done);
    expect(s.busy()).toBe(true);
    expect(s.ready()).toBe(false);
    answer.next('saved');
    expect(s.busy()).toBe(false);
    expect(done).toHaveBeenCalledWith('saved');
    expect(s.error()).toBeNull();
  });

  it('when the server refuses an API key, then its message goes on the mapped box and the message above names the label, never the key', () => {
    const f = form();
    f.controls.name.setValue('North Section');
    const s = make(f);
    s.send(
      throwError(
        () =>
          new ApiError(400, 'invalid_input', 'Check the form: widthM: Working width must be more than 0', {
            widthM: 'Working width must be more than 0',
          }),
      ),
      jest.fn(),
    );
    expect(s.busy()).toBe(false);
    expect(f.controls.width.getError('server')).toBe('Working width must be more than 0');
    expect(f.controls.width.touched).toBe(true);
    expect(s.error()).toBe('Check Working width: Working width must be more than 0');
    expect(s.error()).not.toContain('widthM');
    expect(s.blocked()).toBe(true);
    // Any change lets the person try again; the mark goes when its own box changes.
    f.controls.name.setValue('North Section B');
    expect(s.blocked()).toBe(false);
    f.controls.width.setValue(11);
    expect(f.controls.width.getError('server')).toBeNull();
    expect(s.error()).toBeNull();
  });

  it('when the server refuses without naming a box, then its message shows above the form', () => {
    const f = form();
    const s = make(f);
    s.send(
      throwError(() => new ApiError(409, 'conflict', 'Someone changed this first')),
      jest.fn(),
    );
    expect(s.error()).toBe('Someone changed this first');
    expect(s.blocked()).toBe(false);
  });

  it('when a key no box takes is refused, then its message shows without the key', () => {
    const s = make(form());
    s.send(
      throwError(
        () => new ApiError(400, 'invalid_input', 'Check the form: headingDeg: Enter a heading', { headingDeg: 'Enter a heading' }),
      ),
      jest.fn(),
    );
    expect(s.error()).toBe('Enter a heading');
  });

  it('when a form has its own way to word failures, then that message shows', () => {
    const s = make(form(), () => 'Start was not sent: no connection');
    s.send(
      throwError(() => new Error('offline')),
      jest.fn(),
    );
    expect(s.error()).toBe('Start was not sent: no connection');
  });
});
