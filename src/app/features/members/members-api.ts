import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { Member, Role } from '@shared/schemas/auth';
import { type Observable } from 'rxjs';

export const MEMBERS_URL = '/api/members';

/** Writes to the farm's member list (owner only on the server). Reads use httpResource on MEMBERS_URL. */
@Injectable({ providedIn: 'root' })
export class MembersApi {
  private readonly http = inject(HttpClient);

  invite(body: { email: string; name: string; role: Role }): Observable<Member> {
    return this.http.post<Member>(`${MEMBERS_URL}/invite`, body);
  }

  changeRole(id: number, role: Role): Observable<Member> {
    return this.http.patch<Member>(`${MEMBERS_URL}/${id}`, { role });
  }

  remove(id: number): Observable<void> {
    return this.http.delete<void>(`${MEMBERS_URL}/${id}`);
  }
}
