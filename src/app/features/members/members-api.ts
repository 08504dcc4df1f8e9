import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { Member, Role } from '@shared/schemas/auth';
import { type Observable } from 'rxjs';
import { API } from '../../core/http/api-paths';

export const MEMBERS_URL = API.members;

/** Writes to the farm's member list (owner only on the server). Reads use httpResource on MEMBERS_URL. */
@Injectable({ providedIn: 'root' })
export class MembersApi {
  private readonly http = inject(HttpClient);

  invite(body: { email: string; name: string; role: Role }): Observable<Member> {
    return this.http.post<Member>(API.memberInvite, body);
  }

  changeRole(id: number, role: Role): Observable<Member> {
    return this.http.patch<Member>(API.member(id), { role });
  }

  remove(id: number): Observable<void> {
    return this.http.delete<void>(API.member(id));
  }
}
