import { FormControl, FormGroup, Validators } from '@angular/forms';
import { Subject, throwError } from 'rxjs';
import { ApiError } from '../../core/http/api-error';
import { FormSubmission } from './form-submission';

describe('FormSubmission', () => {
  const form = () => new FormGroup({ name: new FormControl('', { nonNullable: true, validators: [Validators.required] }) });

  it('when the form has a problem, then it is not ready and the problem shows', () => {
    const f = form();
    const s = new FormSubmission(f);
    expect(s.ready()).toBe(false);
    expect(f.controls.name.touched).toBe(true);
    f.controls.name.setValue('North Section');
    expect(s.ready()).toBe(true);
  });

  it('when a request runs, then it is busy until the answer and not ready twice', () => {
    const f = form();
    f.controls.name.setValue('North Section');
    const s = new FormSubmission(f);
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

  it('when the server refuses, then field messages go on the controls and the rest above the form', () => {
    const f = form();
    const s = new FormSubmission(f);
    s.send(
      throwError(() => new ApiError(400, 'invalid', 'Check the marked fields', { name: 'That name is taken' })),
      jest.fn(),
    );
    expect(s.busy()).toBe(false);
    expect(f.controls.name.getError('server')).toBe('That name is taken');
    expect(s.error()).toBeNull();
    s.send(
      throwError(() => new ApiError(409, 'conflict', 'Someone changed this first')),
      jest.fn(),
    );
    expect(s.error()).toBe('Someone changed this first');
  });

  it('when a form has its own way to word failures, then that message shows', () => {
    const s = new FormSubmission(form(), () => 'Start was not sent: no connection');
    s.send(
      throwError(() => new Error('offline')),
      jest.fn(),
    );
    expect(s.error()).toBe('Start was not sent: no connection');
  });
});
