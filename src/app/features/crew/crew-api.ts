import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { Operation } from '@shared/operations';
import type { CrewMember, SkillLevel } from '@shared/schemas/fleet';
import { type Observable } from 'rxjs';
import { API } from '../../core/http/api-paths';

export const CREW_URL = API.crew;

export type SkillChoice = SkillLevel | 'none';

/** Writes crew skills (owner only on the server). Reads use httpResource on CREW_URL. */
@Injectable({ providedIn: 'root' })
export class CrewApi {
  private readonly http = inject(HttpClient);

  setSkill(membershipId: number, operation: Operation, level: SkillChoice): Observable<CrewMember> {
    return this.http.put<CrewMember>(API.crewSkill(membershipId, operation), { level });
  }
}
