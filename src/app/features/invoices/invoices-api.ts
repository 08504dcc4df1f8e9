import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { InvoiceDetail, InvoiceDraftBody, InvoiceSettings } from '@shared/schemas/invoices';
import type { Observable } from 'rxjs';
import { API } from '../../core/http/api-paths';

/** Writes of invoices (owner only on the server). Reads use httpResource on the API paths. */
@Injectable({ providedIn: 'root' })
export class InvoicesApi {
  private readonly http = inject(HttpClient);

  draft(body: InvoiceDraftBody): Observable<InvoiceDetail> {
    return this.http.post<InvoiceDetail>(API.invoices, body);
  }

  /** Sends a draft (or retries a sent one whose payment link or e-mail was not made). */
  send(id: number): Observable<InvoiceDetail> {
    return this.http.post<InvoiceDetail>(API.invoiceAction(id, 'send'), {});
  }

  void(id: number, reason: string): Observable<InvoiceDetail> {
    return this.http.post<InvoiceDetail>(API.invoiceAction(id, 'void'), { reason });
  }

  /** A credit note for the whole invoice; answers the credit note. */
  credit(id: number, reason: string): Observable<InvoiceDetail> {
    return this.http.post<InvoiceDetail>(API.invoiceAction(id, 'credit'), { reason });
  }

  saveSettings(body: InvoiceSettings): Observable<InvoiceSettings> {
    return this.http.put<InvoiceSettings>(API.invoiceSettings, body);
  }
}
