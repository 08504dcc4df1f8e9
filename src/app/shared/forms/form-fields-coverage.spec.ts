import { readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import * as authSchemas from '@shared/schemas/auth';
import * as boardSchemas from '@shared/schemas/board';
import * as costSchemas from '@shared/schemas/costs';
import * as customerSchemas from '@shared/schemas/customers';
import * as farmSchemas from '@shared/schemas/farm';
import * as fieldSchemas from '@shared/schemas/fields';
import * as fleetSchemas from '@shared/schemas/fleet';
import * as invoiceSchemas from '@shared/schemas/invoices';
import * as phoneTrackSchemas from '@shared/schemas/phone-track';
import * as planSchemas from '@shared/schemas/plans';
import * as rateCardSchemas from '@shared/schemas/rate-card';
import * as runSheetSchemas from '@shared/schemas/run-sheet';
import * as weatherSchemas from '@shared/schemas/weather';
import * as z from 'zod';
import { FORGOT_PASSWORD_FIELDS } from '../../features/auth/forgot-password/forgot-password';
import { SET_PASSWORD_FIELDS } from '../../features/auth/password-rules';
import { SIGN_IN_FIELDS } from '../../features/auth/sign-in/sign-in';
import { CUSTOMER_FIELDS } from '../../features/custom-work/customer-form/customer-form';
import { RATE_FIELDS } from '../../features/custom-work/rate-row/rate-row';
import { DRAFT_INVOICE_FIELDS } from '../../features/invoices/draft-invoice/draft-invoice';
import { REASON_FIELDS } from '../../features/invoices/reason-dialog/reason-dialog';
import { TAX_SETTINGS_FIELDS } from '../../features/invoices/tax-settings/tax-settings';
import { ASSIGNMENT_FIELDS } from '../../features/board/assignment-form/assignment-form';
import { CROP_PLAN_FIELDS } from '../../features/fields/crop-plans/crop-plans';
import { FIELD_FORM_FIELDS } from '../../features/fields/field-form-fields';
import { HAZARD_FIELDS } from '../../features/fields/hazard-form/hazard-form';
import { IMPLEMENT_FIELDS } from '../../features/fleet/implement-form/implement-form';
import { MACHINE_FIELDS } from '../../features/fleet/machine-form/machine-form';
import { FARM_SETTINGS_FIELDS } from '../../features/members/farm-settings/farm-settings';
import { HOURLY_COST_FIELDS } from '../../features/members/hourly-cost-row/hourly-cost-row';
import { INVITE_FIELDS } from '../../features/members/invite-member/invite-member';
import { WEATHER_LIMIT_FIELDS } from '../../features/members/weather-limits/limit-rows';
import { FUEL_COST_FIELDS } from '../../features/members/work-costs/work-costs';
import { PASS_PLAN_FIELDS } from '../../features/pass-plan/plan-settings';
import { CALL_OFF_FIELDS } from '../../features/run-sheet/call-off-dialog/call-off-dialog';
import { FINISH_FIELDS } from '../../features/run-sheet/finish-dialog/finish-dialog';
import { PROBLEM_FIELDS } from '../../features/run-sheet/problem-dialog/problem-dialog';
import { START_FIELDS } from '../../features/run-sheet/start-dialog/start-dialog';
import { type FormFields, fieldFor } from './field-labels';

/**
 * Where each request body a route checks with `body(req, schema)` is typed: the forms that send it
 * (their maps must label every key its error's `fields` can carry), or why no form sends it.
 * `sentByApp` lists keys the app fills in itself (no box to name); their refusals show as words only.
 */
type Sender = { forms: FormFields[]; sentByApp?: string[] } | { noForm: string };

const SENDERS: Record<string, Sender> = {
  planSettings: { forms: [PASS_PLAN_FIELDS] },
  planPreviewBody: { forms: [PASS_PLAN_FIELDS] },
  assignmentCreateBody: { forms: [ASSIGNMENT_FIELDS] },
  assignmentPatchBody: { forms: [ASSIGNMENT_FIELDS] },
  boardOrderBody: { noForm: 'cards dragged between columns on the board: no boxes, the board version and the new order only' },
  publishBody: { noForm: 'the Publish button: the board version only' },
  loginBody: { forms: [SIGN_IN_FIELDS] },
  forgotBody: { forms: [FORGOT_PASSWORD_FIELDS] },
  setPasswordBody: { forms: [SET_PASSWORD_FIELDS] },
  skillBody: { noForm: 'one menu per cell of the crew table; a refusal shows as a message on the table' },
  weatherLimitsBody: { forms: [WEATHER_LIMIT_FIELDS] },
  inviteBody: { forms: [INVITE_FIELDS] },
  roleChangeBody: { noForm: 'one role menu per row of the members table; a refusal shows as a message on the table' },
  fieldCreateBody: { forms: [FIELD_FORM_FIELDS] },
  fieldPatchBody: { forms: [FIELD_FORM_FIELDS] },
  // The shape is drawn on the map, not typed; confirming a reported hazard is a button.
  hazardBody: { forms: [HAZARD_FIELDS], sentByApp: ['geometry'] },
  hazardPatchBody: { forms: [HAZARD_FIELDS], sentByApp: ['geometry', 'status'] },
  cropPlanBody: { forms: [CROP_PLAN_FIELDS] },
  cropCopyBody: { noForm: 'the "copy last season" button: the season only' },
  machineBody: { forms: [MACHINE_FIELDS] },
  machinePatchBody: { forms: [MACHINE_FIELDS] },
  implementBody: { forms: [IMPLEMENT_FIELDS] },
  implementPatchBody: { forms: [IMPLEMENT_FIELDS] },
  // The action's id is made on the phone (a UUID), never typed.
  eventBody: { forms: [START_FIELDS, FINISH_FIELDS, CALL_OFF_FIELDS], sentByApp: ['type', 'clientEventId'] },
  // A report's id and time are made on the phone when it is written, never typed.
  problemBody: { forms: [PROBLEM_FIELDS], sentByApp: ['clientEventId', 'at'] },
  logPatchBody: { noForm: 'API only: no screen edits a job log yet' },
  outboxBody: {
    noForm:
      'the phone’s waiting actions sent together: each was typed in the start, finish, call-off or problem form, and a refusal shows as words on its job',
  },
  trackChunkBody: { noForm: 'positions the phone records while Record track is on: nothing typed; a refusal shows beside the switch' },
  farmPatchBody: { forms: [FARM_SETTINGS_FIELDS] },
  fuelCostBody: { forms: [FUEL_COST_FIELDS] },
  hourlyCostBody: { forms: [HOURLY_COST_FIELDS] },
  customerBody: { forms: [CUSTOMER_FIELDS] },
  customerPatchBody: { forms: [CUSTOMER_FIELDS] },
  fieldCustomerBody: {
    noForm: 'the field ticks in the customer form: the customer id is the form’s own; a refusal shows as words above it',
  },
  rateBody: { forms: [RATE_FIELDS] },
  invoiceDraftBody: { forms: [DRAFT_INVOICE_FIELDS] },
  invoiceVoidBody: { forms: [REASON_FIELDS] },
  invoiceCreditBody: { forms: [REASON_FIELDS] },
  invoiceSettingsBody: { forms: [TAX_SETTINGS_FIELDS] },
};

const SCHEMAS: Record<string, unknown> = {
  ...authSchemas,
  ...boardSchemas,
  ...costSchemas,
  ...customerSchemas,
  ...farmSchemas,
  ...fieldSchemas,
  ...fleetSchemas,
  ...invoiceSchemas,
  ...phoneTrackSchemas,
  ...planSchemas,
  ...rateCardSchemas,
  ...runSheetSchemas,
  ...weatherSchemas,
};

/** The schema names every `body(req, name)` in server/**\/*.routes.ts uses. */
function routeBodySchemas(): string[] {
  const root = join(process.cwd(), 'server');
  const files = readdirSync(root, { recursive: true, encoding: 'utf8' }).filter((f) => f.endsWith('.routes.ts'));
  const names = new Set<string>();
  for (const file of files) {
    for (const m of readFileSync(join(root, file), 'utf8').matchAll(/\bbody\(req,\s*([A-Za-z_$][\w$]*)\)/g)) names.add(m[1]);
  }
  return [...names].sort();
}

/**
 * The keys an error body's `fields` can carry for a schema: each issue's path joined with dots
 * (server/http/validate.ts), so every leaf of the body's objects, down through nested objects
 * (`seeding.soilMinC.canola`); an array, record or other value is a leaf (its items fall to it).
 */
function errorKeys(schema: z.ZodType, prefix = ''): string[] {
  const def = (schema as unknown as { def: { type: string; innerType?: z.ZodType; in?: z.ZodType } }).def;
  if (def.type === 'optional' || def.type === 'nullable' || def.type === 'default' || def.type === 'prefault') {
    return errorKeys(def.innerType!, prefix);
  }
  if (def.type === 'pipe') return errorKeys(def.in!, prefix);
  if (schema instanceof z.ZodObject) {
    return Object.entries(schema.shape as Record<string, z.ZodType>).flatMap(([key, s]) => {
      const path = prefix ? `${prefix}.${key}` : key;
      const inner = errorKeys(s, path);
      // An object-valued key is also a key of its own (when the whole object is missing).
      return inner.length && inner[0] !== path ? [path, ...inner] : [path];
    });
  }
  return prefix ? [prefix] : [];
}

describe('Every key a route can refuse is named by a form label', () => {
  it('when the routes are read, then each body schema they check is known here, with its forms or why it has none', () => {
    const used = routeBodySchemas();
    expect(used.length).toBeGreaterThan(20);
    expect(used.filter((name) => !(name in SENDERS))).toEqual([]);
    expect(used.filter((name) => !(SCHEMAS[name] instanceof z.ZodType))).toEqual([]);
  });

  it('when the keys of each route body are walked, then some form of that body maps each to a label', () => {
    const unmapped: string[] = [];
    for (const name of routeBodySchemas()) {
      const sender = SENDERS[name];
      if (!sender || 'noForm' in sender) continue;
      for (const key of errorKeys(SCHEMAS[name] as z.ZodType)) {
        // A key the app fills in is its own for every key inside it too (geometry.coordinates).
        if (sender.sentByApp?.some((k) => key === k || key.startsWith(`${k}.`))) continue;
        // An object key is named through its leaves when the form maps those (weather limits).
        const leavesMapped = sender.forms.some((f) => Object.keys(f).some((k) => k.startsWith(`${key}.`)));
        if (!sender.forms.some((f) => fieldFor(key, f)) && !leavesMapped) unmapped.push(`${name}: ${key}`);
      }
    }
    expect(unmapped).toEqual([]);
  });

  it('when a label is shown, then it is words a person reads, never an API key', () => {
    const maps = Object.values(SENDERS).flatMap((s) => ('forms' in s ? s.forms : []));
    for (const map of maps) {
      for (const [key, { label }] of Object.entries(map)) {
        expect(label).not.toBe(key);
        expect(label).not.toMatch(/^[a-z]+[A-Z]\w*$/);
      }
    }
  });

  it('when a schema carries nested objects, then their leaf keys are walked too', () => {
    // A check of the walk itself, on a small schema made here.
    const s = z.object({
      a: z.number(),
      b: z.object({ c: z.string(), d: z.object({ e: z.number() }).optional() }),
      f: z.array(z.number()),
    });
    expect(errorKeys(s)).toEqual(['a', 'b', 'b.c', 'b.d', 'b.d.e', 'f']);
  });
});
