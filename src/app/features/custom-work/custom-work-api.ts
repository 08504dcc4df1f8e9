import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { Operation } from '@shared/operations';
import type { Customer, CustomerBody, CustomerPatchBody, FieldCustomerAnswer } from '@shared/schemas/customers';
import type { RateBody, RateCard } from '@shared/schemas/rate-card';
import type { Observable } from 'rxjs';
import { API } from '../../core/http/api-paths';

/** Writes of custom work (owner only on the server). Reads use httpResource on API.customers and API.rateCard. */
@Injectable({ providedIn: 'root' })
export class CustomWorkApi {
  private readonly http = inject(HttpClient);

  createCustomer(body: CustomerBody): Observable<Customer> {
    return this.http.post<Customer>(API.customers, body);
  }

  updateCustomer(id: number, patch: CustomerPatchBody): Observable<Customer> {
    return this.http.patch<Customer>(API.customer(id), patch);
  }

  deleteCustomer(id: number): Observable<void> {
    return this.http.delete<void>(API.customer(id));
  }

  getCustomer(id: number): Observable<Customer> {
    return this.http.get<Customer>(API.customer(id));
  }

  /** Marks a field as a customer's, or (null) the farm's own again. */
  setFieldCustomer(fieldId: number, customerId: number | null): Observable<FieldCustomerAnswer> {
    return this.http.put<FieldCustomerAnswer>(API.fieldCustomer(fieldId), { customerId });
  }

  setRate(operation: Operation, body: RateBody): Observable<RateCard> {
    return this.http.put<RateCard>(API.rate(operation), body);
  }

  resetRate(operation: Operation): Observable<RateCard> {
    return this.http.delete<RateCard>(API.rate(operation));
  }
}
