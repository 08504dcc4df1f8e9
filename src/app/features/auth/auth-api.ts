import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { Me } from '@shared/schemas/auth';
import { type Observable } from 'rxjs';

/** The signed-out writes: a reset link by e-mail, and setting a password from an e-mailed link. */
@Injectable({ providedIn: 'root' })
export class AuthApi {
  private readonly http = inject(HttpClient);

  forgot(email: string): Observable<{ message: string }> {
    return this.http.post<{ message: string }>('/api/auth/forgot', { email });
  }

  setPassword(body: { token: string; password: string; name?: string }): Observable<Me> {
    return this.http.post<Me>('/api/auth/set-password', body);
  }
}

export function tokenInfoUrl(token: string): string {
  return `/api/auth/token/${encodeURIComponent(token)}`;
}
