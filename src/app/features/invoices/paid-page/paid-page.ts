import { ChangeDetectionStrategy, Component } from '@angular/core';

/**
 * Where the payment service sends a customer after paying an invoice. The customer is not a member
 * of the farm: the page only thanks them; the invoice is marked paid by the service's webhook.
 */
@Component({
  selector: 'app-paid-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <main class="page">
      <h1>Thank you: the invoice is paid</h1>
      <p>The payment service took your payment and tells the farm, which marks the invoice paid on its side.</p>
      <p>Nothing more is needed: you can close this page.</p>
    </main>
  `,
})
export class PaidPage {}
