import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { Implement, ImplementInput, Machine, MachineInput } from '@shared/schemas/fleet';
import { type Observable } from 'rxjs';
import { API } from '../../core/http/api-paths';

export const MACHINES_URL = API.machines;
export const IMPLEMENTS_URL = API.implements;

/** Writes to the farm's fleet (owner only on the server). Reads use httpResource on the URLs above. */
@Injectable({ providedIn: 'root' })
export class FleetApi {
  private readonly http = inject(HttpClient);

  createMachine(body: MachineInput): Observable<Machine> {
    return this.http.post<Machine>(MACHINES_URL, body);
  }

  updateMachine(id: number, patch: Partial<MachineInput>): Observable<Machine> {
    return this.http.patch<Machine>(API.machine(id), patch);
  }

  deleteMachine(id: number): Observable<void> {
    return this.http.delete<void>(API.machine(id));
  }

  createImplement(body: ImplementInput): Observable<Implement> {
    return this.http.post<Implement>(IMPLEMENTS_URL, body);
  }

  updateImplement(id: number, patch: Partial<ImplementInput>): Observable<Implement> {
    return this.http.patch<Implement>(API.implement(id), patch);
  }

  deleteImplement(id: number): Observable<void> {
    return this.http.delete<void>(API.implement(id));
  }
}
