import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { Me } from '@shared/schemas/auth';
import { type Observable } from 'rxjs';
import { API } from '../../core/http/api-paths';

/** The signed-out writes: a reset link by e-mail, and setting a password from an e-mailed link. */
@Injectable({ providedIn: 'root' })
export class AuthApi {
  private readonly http = inject(HttpClient);

  forgot(email: string): Observable<{ message: string }> {
    return this.http.post<{ message: string }>(API.authForgot, { email });
  }

  setPassword(body: { token: string; password: string; name?: string }): Observable<Me> {
    return this.http.post<Me>(API.authSetPassword, body);
  }
}

export function tokenInfoUrl(token: string): string {
  return API.authToken(token);
}
