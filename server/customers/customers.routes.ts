import { idParam } from '../../shared/schemas/common';
import { customerBody, customerPatchBody, fieldCustomerBody } from '../../shared/schemas/customers';
import type { AppDeps } from '../app-deps';
import type { Routes } from '../http/routes';
import { principal } from '../http/session-user';
import { body, params } from '../http/validate';
import * as service from './customers.service';

/** Customers are read by the owner and viewers (the accountant); operators see no customers or money. */
const READERS = ['owner', 'viewer'] as const;

export function customerRoutes(r: Routes, deps: AppDeps): void {
  r.get('/', READERS, async (req, res) => {
    res.json(await service.listCustomers(deps.db, principal(req).farmId));
  });
  r.post('/', ['owner'], async (req, res) => {
    res.status(201).json(await service.createCustomer(deps.db, principal(req).farmId, body(req, customerBody)));
  });
  r.get('/:id', READERS, async (req, res) => {
    res.json(await service.getCustomer(deps.db, principal(req).farmId, params(req, idParam).id));
  });
  r.patch('/:id', ['owner'], async (req, res) => {
    const { id } = params(req, idParam);
    res.json(await service.updateCustomer(deps.db, principal(req).farmId, id, body(req, customerPatchBody)));
  });
  r.delete('/:id', ['owner'], async (req, res) => {
    await service.removeCustomer(deps.db, principal(req).farmId, params(req, idParam).id);
    res.status(204).end();
  });
}

/** `PUT /api/fields/:id/customer`: marks a field as a customer's, or the farm's own again. */
export function fieldCustomerRoutes(r: Routes, deps: AppDeps): void {
  r.put('/:id/customer', ['owner'], async (req, res) => {
    const { id } = params(req, idParam);
    res.json(await service.setFieldCustomer(deps.db, principal(req).farmId, id, body(req, fieldCustomerBody).customerId));
  });
}
