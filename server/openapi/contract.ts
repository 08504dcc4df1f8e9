// What each API route takes and gives, for the OpenAPI document (server/openapi/document.ts).
// The schemas are the very objects the handlers validate with; tests/api/openapi.test.ts records
// which schema each validator used and fails when this file names another one, or none.
// Who may call a route is not repeated here: the document takes it from the route registry.
import * as z from 'zod';
import { forgotBody, inviteBody, loginBody, roleChangeBody, setPasswordBody, tokenParam } from '../../shared/schemas/auth';
import {
  assignmentCreateBody,
  assignmentPatchBody,
  boardDateParam,
  boardOrderBody,
  boardQuery,
  publishBody,
} from '../../shared/schemas/board';
import { failedJobList, jobIdParam } from '../../shared/schemas/background';
import { idParam } from '../../shared/schemas/common';
import { farmPatchBody } from '../../shared/schemas/farm';
import {
  cropCopyBody,
  cropParams,
  cropPlan,
  cropPlanBody,
  fieldCreateBody,
  fieldDetail,
  fieldPatchBody,
  hazardBody,
  hazardParams,
  hazardPatchBody,
  importQuery,
  importSaved,
  importSelection,
  seasonParam,
  seasonQuery,
} from '../../shared/schemas/fields';
import { implementBody, implementPatchBody, machineBody, machinePatchBody, skillBody, skillParams } from '../../shared/schemas/fleet';
import { planListQuery, planParams, planPreviewBody, planSettings } from '../../shared/schemas/plans';
import { paymentWebhookAnswer } from '../../shared/schemas/payments';
import { eventBody, logPatchBody, outboxBody, problemBody, runSheetQuery } from '../../shared/schemas/run-sheet';
import { trackChunkBody } from '../../shared/schemas/phone-track';
import { costItemParams, costSettingsAnswer, fuelCostBody, hourlyCostBody } from '../../shared/schemas/costs';
import {
  customer,
  customerBody,
  customerList,
  customerPatchBody,
  fieldCustomerAnswer,
  fieldCustomerBody,
} from '../../shared/schemas/customers';
import { rateBody, rateCard, rateParams } from '../../shared/schemas/rate-card';
import {
  invoiceCreditBody,
  invoiceDetail,
  invoiceDraftBody,
  invoiceExportParams,
  invoiceList,
  invoiceSettings,
  invoiceSettingsBody,
  invoiceVoidBody,
  paymentList,
  receivables,
} from '../../shared/schemas/invoices';
import { seasonExportParams, seasonIndex, seasonParams, seasonSummary } from '../../shared/schemas/season';
import { fieldForecast, weatherFieldParams, weatherLimitsAnswer, weatherLimitsBody } from '../../shared/schemas/weather';

export interface ResponseContract {
  status: number;
  description: string;
  /** The zod schema of the answer, where one exists. */
  schema?: z.ZodType;
  /** Else the name of its TypeScript type in shared/schemas, for the reader. */
  type?: string;
  /** Defaults to application/json; none for 204. */
  contentType?: string;
}

export interface RouteContract {
  /** One plain sentence. */
  summary: string;
  params?: z.ZodType;
  query?: z.ZodType;
  body?: z.ZodType;
  /** A multipart/form-data upload: the file's form field, and other form fields (JSON text) with their schemas. */
  upload?: { file: string; fields: Record<string, z.ZodType> };
  /**
   * The board version a write was made on may also come as an `If-Match` header (and, for a
   * DELETE, as `?version=`): read by server/board/board-version.ts, not by a zod validator.
   */
  boardVersion?: 'header' | 'header-or-query';
  /** The success answers, the usual one first. */
  responses: [ResponseContract, ...ResponseContract[]];
}

/** The key of a route, as in the matrix files: `POST /api/plans/preview` (no trailing slash). */
export const routeKey = (method: string, path: string): string => `${method.toUpperCase()} ${path.replace(/(.)\/$/, '$1')}`;

const json = (description: string, s: z.ZodType | string, status = 200): ResponseContract =>
  typeof s === 'string' ? { status, description, type: s } : { status, description, schema: s };
const noContent = (description: string): ResponseContract => ({ status: 204, description });

const fieldCrop = cropPlan.extend({ fieldId: z.number().int() });

export const CONTRACT: Record<string, RouteContract> = {
  // Foundation
  'GET /api/health': {
    summary: 'Says whether the server and its database are answering.',
    responses: [
      json('The server and database are up.', z.object({ status: z.literal('ok'), db: z.literal('ok') })),
      json('The database is down.', z.object({ status: z.literal('degraded'), db: z.literal('down') }), 503),
    ],
  },
  'GET /api/config': {
    summary: 'Gives the settings the app needs before sign-in, such as the optional map tile layer.',
    responses: [json('The settings.', z.object({ mapTileUrl: z.string().nullable(), mapTileAttribution: z.string().nullable() }))],
  },
  'GET /api/auth/me': {
    summary: 'Tells who is signed in, on which farm and with which role.',
    responses: [json('The signed-in person.', 'Me')],
  },
  'POST /api/auth/login': {
    summary: 'Signs in with e-mail and password and starts a session.',
    body: loginBody,
    responses: [json('Signed in; a new session cookie and XSRF token are set.', 'Me')],
  },
  'POST /api/auth/logout': { summary: 'Signs out and ends the session.', responses: [noContent('Signed out.')] },
  'POST /api/auth/forgot': {
    summary: 'Sends a link to set a new password, if the address belongs to an account.',
    body: forgotBody,
    responses: [json('Always the same answer, whether or not the address has an account.', z.object({ message: z.string() }), 202)],
  },
  'GET /api/auth/token/:token': {
    summary: 'Tells what an invitation or password link is for, while it is still valid.',
    params: tokenParam,
    responses: [json('The link is valid.', 'TokenInfo')],
  },
  'POST /api/auth/set-password': {
    summary: 'Sets a password with an invitation or password link and signs in.',
    body: setPasswordBody,
    responses: [json('Password set and signed in.', 'Me')],
  },
  'GET /api/members': { summary: 'Lists the people of the farm with their roles.', responses: [json('The members.', 'Member[]')] },
  'POST /api/members/invite': {
    summary: 'Invites a person to the farm by e-mail with a role.',
    body: inviteBody,
    responses: [json('The invited member.', 'Member', 201)],
  },
  'PATCH /api/members/:id': {
    summary: "Changes a member's role.",
    params: idParam,
    body: roleChangeBody,
    responses: [json('The member with the new role.', 'Member')],
  },
  'DELETE /api/members/:id': { summary: 'Removes a person from the farm.', params: idParam, responses: [noContent('Removed.')] },
  'GET /api/background/failed': {
    summary: "Lists the farm's background jobs (e-mails) that failed for good, newest first.",
    responses: [json('The failed jobs.', failedJobList)],
  },
  'POST /api/background/failed/:id/retry': {
    summary: 'Tries a failed background job again.',
    params: jobIdParam,
    responses: [noContent('Back in its queue.')],
  },
  'GET /api/farm': {
    summary: "Gives the farm's settings: name, units, a day's hour limit and time zone.",
    responses: [json('The settings.', 'FarmSettings')],
  },
  'PATCH /api/farm': {
    summary: "Changes the farm's settings.",
    body: farmPatchBody,
    responses: [json('The settings after the change.', 'FarmSettings')],
  },

  // Fields
  'GET /api/fields': {
    summary: 'Lists the fields of the farm with their acres and crop of the season.',
    query: seasonQuery,
    responses: [json('The fields.', 'FieldSummary[]')],
  },
  'GET /api/fields/export.geojson': {
    summary: 'Downloads every field and hazard as one GeoJSON file.',
    query: seasonQuery,
    responses: [
      {
        status: 200,
        description: 'A GeoJSON FeatureCollection (RFC 7946).',
        type: 'FeatureCollection',
        contentType: 'application/geo+json',
      },
    ],
  },
  'POST /api/fields': {
    summary: 'Adds a field from its drawn or pasted boundary.',
    body: fieldCreateBody,
    query: seasonQuery,
    responses: [json('The new field.', fieldDetail, 201)],
  },
  'POST /api/fields/import': {
    summary: 'Reads a boundary file (GeoJSON, KML, KMZ or zipped shapefile) and previews or saves its fields.',
    query: importQuery,
    upload: { file: 'file', fields: { selection: importSelection } },
    responses: [
      json('The fields saved.', importSaved, 201),
      json('With dryRun=true: what the file holds, nothing saved.', 'ImportPreview'),
    ],
  },
  'GET /api/fields/:id': {
    summary: 'Gives one field with its boundary, hazards and crop plans.',
    params: idParam,
    query: seasonQuery,
    responses: [json('The field.', fieldDetail)],
  },
  'PATCH /api/fields/:id': {
    summary: "Changes a field's name, boundary or notes.",
    params: idParam,
    body: fieldPatchBody,
    query: seasonQuery,
    responses: [json('The field after the change.', fieldDetail)],
  },
  'DELETE /api/fields/:id': {
    summary: 'Deletes a field with its hazards and crop plans.',
    params: idParam,
    responses: [noContent('Deleted.')],
  },
  'POST /api/fields/:id/hazards': {
    summary: 'Marks a hazard on a field.',
    params: idParam,
    body: hazardBody,
    responses: [json('The hazard as a GeoJSON Feature.', 'Feature', 201)],
  },
  'PATCH /api/fields/:id/hazards/:hazardId': {
    summary: 'Changes or confirms a hazard.',
    params: hazardParams,
    body: hazardPatchBody,
    responses: [json('The hazard as a GeoJSON Feature.', 'Feature')],
  },
  'DELETE /api/fields/:id/hazards/:hazardId': {
    summary: 'Removes a hazard from a field.',
    params: hazardParams,
    responses: [noContent('Removed.')],
  },
  'PUT /api/fields/:id/crops/:season': {
    summary: "Sets a field's crop for a season.",
    params: cropParams,
    body: cropPlanBody,
    responses: [json('The crop plan.', fieldCrop)],
  },
  'DELETE /api/fields/:id/crops/:season': {
    summary: "Clears a field's crop for a season.",
    params: cropParams,
    responses: [noContent('Cleared.')],
  },
  'GET /api/crop-plans/:season': {
    summary: 'Lists the crop plans of every field for a season.',
    params: seasonParam,
    responses: [json('The crop plans.', z.array(fieldCrop))],
  },
  'POST /api/crop-plans/:season/copy': {
    summary: "Copies another season's crop plans into this season.",
    params: seasonParam,
    body: cropCopyBody,
    responses: [json('How many plans were copied.', z.object({ copied: z.number().int() }))],
  },

  // Pass plans
  'POST /api/plans/preview': {
    summary: 'Computes a pass plan for a field or a boundary without saving it.',
    body: planPreviewBody,
    responses: [json('The plan.', 'PlanResult')],
  },
  'GET /api/plans': {
    summary: 'Lists the saved pass plans, of one field or of all.',
    query: planListQuery,
    responses: [json('The saved plans.', 'SavedPlan[]')],
  },
  'GET /api/plans/:fieldId/:operation': {
    summary: "Gives a field's saved plan for an operation, with its passes.",
    params: planParams,
    responses: [json('The plan.', 'SavedPlan & { result: PlanResult }')],
  },
  'GET /api/plans/:fieldId/:operation/passes.geojson': {
    summary: "Downloads a saved plan's passes as a GeoJSON file.",
    params: planParams,
    responses: [
      {
        status: 200,
        description: 'A GeoJSON FeatureCollection of the passes.',
        type: 'FeatureCollection',
        contentType: 'application/geo+json',
      },
    ],
  },
  'PUT /api/plans/:fieldId/:operation': {
    summary: "Saves a field's plan for an operation with these settings.",
    params: planParams,
    body: planSettings,
    responses: [json('The saved plan.', 'SavedPlan & { result: PlanResult }')],
  },
  'DELETE /api/plans/:fieldId/:operation': {
    summary: "Deletes a field's saved plan for an operation.",
    params: planParams,
    responses: [noContent('Deleted.')],
  },

  // Fleet and crew
  'GET /api/fleet/machines': { summary: 'Lists the machines of the farm.', responses: [json('The machines.', 'Machine[]')] },
  'POST /api/fleet/machines': { summary: 'Adds a machine.', body: machineBody, responses: [json('The new machine.', 'Machine', 201)] },
  'GET /api/fleet/machines/:id': { summary: 'Gives one machine.', params: idParam, responses: [json('The machine.', 'Machine')] },
  'PATCH /api/fleet/machines/:id': {
    summary: 'Changes a machine.',
    params: idParam,
    body: machinePatchBody,
    responses: [json('The machine after the change.', 'Machine')],
  },
  'DELETE /api/fleet/machines/:id': { summary: 'Removes a machine.', params: idParam, responses: [noContent('Removed.')] },
  'GET /api/fleet/implements': { summary: 'Lists the implements of the farm.', responses: [json('The implements.', 'Implement[]')] },
  'POST /api/fleet/implements': {
    summary: 'Adds an implement.',
    body: implementBody,
    responses: [json('The new implement.', 'Implement', 201)],
  },
  'GET /api/fleet/implements/:id': { summary: 'Gives one implement.', params: idParam, responses: [json('The implement.', 'Implement')] },
  'PATCH /api/fleet/implements/:id': {
    summary: 'Changes an implement.',
    params: idParam,
    body: implementPatchBody,
    responses: [json('The implement after the change.', 'Implement')],
  },
  'DELETE /api/fleet/implements/:id': { summary: 'Removes an implement.', params: idParam, responses: [noContent('Removed.')] },
  'GET /api/crew': { summary: 'Lists the crew with their skills per operation.', responses: [json('The crew.', 'CrewMember[]')] },
  'PUT /api/crew/:membershipId/skills/:operation': {
    summary: "Sets a crew member's skill level for an operation.",
    params: skillParams,
    body: skillBody,
    responses: [json('The crew member after the change.', 'CrewMember')],
  },

  // Work board, run sheet and job log
  'GET /api/board': {
    summary: 'Gives the work board of a day: who runs what, where, in which order.',
    query: boardQuery,
    responses: [json('The board (gzip-compressed when asked, with an ETag).', 'Board')],
  },
  'POST /api/board/:date/order': {
    summary: "Reorders the jobs in the board's columns for a day.",
    params: boardDateParam,
    body: boardOrderBody,
    boardVersion: 'header',
    responses: [json('The board after the change.', 'Board')],
  },
  'POST /api/board/:date/publish': {
    summary: "Publishes a day's board and queues each operator's work order by e-mail.",
    params: boardDateParam,
    body: publishBody,
    boardVersion: 'header',
    responses: [json('What was published and sent.', 'PublishResult')],
  },
  'GET /api/board/:date/taskdata.zip': {
    summary: 'Downloads every job of a board day as ISO 11783-10 task data for a tractor terminal.',
    params: boardDateParam,
    responses: [{ status: 200, description: 'A zip holding TASKDATA/TASKDATA.XML (task-data version 4).', contentType: 'application/zip' }],
  },
  'GET /api/assignments/:id/taskdata.zip': {
    summary: 'Downloads one job as ISO 11783-10 task data for a tractor terminal.',
    params: idParam,
    responses: [{ status: 200, description: 'A zip holding TASKDATA/TASKDATA.XML (task-data version 4).', contentType: 'application/zip' }],
  },
  'POST /api/assignments': {
    summary: 'Puts a job on the board.',
    body: assignmentCreateBody,
    boardVersion: 'header',
    responses: [json('The board after the change.', 'Board', 201)],
  },
  'PATCH /api/assignments/:id': {
    summary: 'Changes a job on the board.',
    params: idParam,
    body: assignmentPatchBody,
    boardVersion: 'header',
    responses: [json('The board after the change.', 'Board')],
  },
  'DELETE /api/assignments/:id': {
    summary: 'Takes a job off the board.',
    params: idParam,
    boardVersion: 'header-or-query',
    responses: [json('The board after the change.', 'Board')],
  },
  'POST /api/assignments/:id/events': {
    summary: 'Logs a job starting, pausing, resuming, finishing or being called off.',
    params: idParam,
    body: eventBody,
    responses: [json('The job as it shows on the run sheet.', 'RunSheetItem', 201)],
  },
  'POST /api/assignments/:id/coverage': {
    summary:
      'Measures what a track file (GPX, GeoJSON, or an ISO 11783-10 TimeLog in a TASKDATA.zip) covered of the job field and stores it with the job.',
    params: idParam,
    upload: { file: 'file', fields: {} },
    responses: [json('Covered, skipped and twice-worked acres, the skips and where they are.', 'JobCoverage', 201)],
  },
  'GET /api/assignments/:id/coverage': {
    summary: 'A job measured coverage (null until a track is measured) with its field, for the job map.',
    params: idParam,
    responses: [json('The job, its field and its coverage.', 'JobCoverageView')],
  },
  'POST /api/assignments/:id/track-points': {
    summary:
      'Stores a chunk of the phone track the job operator records while the job is underway; the same chunk id sent again adds nothing and gets the same answer.',
    params: idParam,
    body: trackChunkBody,
    responses: [json('The chunk id and the number of its points.', 'TrackChunkAnswer', 201)],
  },
  'GET /api/assignments/:id/track-points': {
    summary: 'The phone track recorded for a job, in the order it was taken (the owner and the job operator).',
    params: idParam,
    responses: [json('Every point with its time, position, accuracy, heading and speed.', 'PhoneTrack')],
  },
  'POST /api/assignments/:id/coverage/from-phone-track': {
    summary:
      'Measures what the job phone track covered (every point while underway counts as working) and stores it with the job, its source "phone track".',
    params: idParam,
    responses: [json('Covered, skipped and twice-worked acres, the skips and where they are.', 'JobCoverage', 201)],
  },
  'POST /api/assignments/:id/problems': {
    summary: 'Reports a problem on a job: a breakdown, a hazard or something else.',
    params: idParam,
    body: problemBody,
    responses: [json('The job as it shows on the run sheet.', 'RunSheetItem', 201)],
  },
  'PATCH /api/assignments/:id/log': {
    summary: "Corrects a job's logged acres, hours or engine-hour meter readings.",
    params: idParam,
    body: logPatchBody,
    responses: [json('The job after the correction.', 'RunSheetItem')],
  },
  'DELETE /api/assignments/:id/log': {
    summary: "Deletes a job's log, back to planned.",
    params: idParam,
    responses: [json('The job after the change.', 'RunSheetItem')],
  },
  'GET /api/run-sheet': {
    summary: "Gives a person's jobs for a day, in order; without a day, their next day with work.",
    query: runSheetQuery,
    responses: [json('The run sheet.', 'RunSheet')],
  },
  'POST /api/run-sheet/outbox': {
    summary:
      "Sends a phone's waiting run-sheet actions at once, in tap order, each answered as the single action routes answer it (short answers), exactly once per action id.",
    body: outboxBody,
    responses: [json("Each action's status and answer, in the order sent.", 'OutboxAnswer')],
  },
  'GET /api/reports': {
    summary: 'Lists the open reports from the field and the machines a breakdown has put down.',
    responses: [json('The open reports.', 'FieldReports')],
  },
  'POST /api/reports/:id/confirm': {
    summary: 'Confirms a report from the field (a reported hazard becomes confirmed).',
    params: idParam,
    responses: [json('The report.', 'FieldReport')],
  },
  'POST /api/reports/:id/dismiss': {
    summary: 'Dismisses a report from the field.',
    params: idParam,
    responses: [json('The report.', 'FieldReport')],
  },

  // Season
  'GET /api/season': { summary: 'Lists the seasons with crop plans or logged work.', responses: [json('The seasons.', seasonIndex)] },
  'GET /api/season/:year/summary': {
    summary: "Gives a season's report: acres, hours and rates by operation, field, person and machine.",
    params: seasonParams,
    responses: [json('The report.', seasonSummary)],
  },
  'GET /api/season/:year/export/:table.csv': {
    summary: "Downloads one table of a season's report as CSV.",
    params: seasonExportParams,
    responses: [{ status: 200, description: 'The table as CSV.', contentType: 'text/csv' }],
  },

  // Weather
  'GET /api/weather/fields/:fieldId': {
    summary: "Gives a field's hourly forecast with go, caution or no-go per operation, its age and whether it is stale.",
    params: weatherFieldParams,
    responses: [json('The forecast (no hours, marked stale, before the first one arrives).', fieldForecast)],
  },
  'GET /api/weather/limits': {
    summary: "Gives the farm's weather limits per operation, the defaults and each default's source.",
    responses: [json('The limits.', weatherLimitsAnswer)],
  },
  'PUT /api/weather/limits': {
    summary: "Sets the farm's weather limits per operation.",
    body: weatherLimitsBody,
    responses: [json('The limits after the change.', weatherLimitsAnswer)],
  },

  // Payments
  'POST /api/payments/webhook': {
    summary:
      "Takes the payment service's events. Public and outside the CSRF check: the Stripe-Signature header, checked with the service's SDK, authenticates it. Each event id is recorded once; a replay answers as the first time and changes nothing.",
    responses: [json('Received: what was done with the event, and whether it was a replay.', paymentWebhookAnswer)],
  },

  // Costs of the farm's own work (money: owner and viewers only)
  'GET /api/costs': {
    summary:
      "Gives the farm's fuel price, fuel use per acre per operation with each default's source, and the hourly costs of machines and people.",
    responses: [json('The rates.', costSettingsAnswer)],
  },
  'PUT /api/costs/fuel': {
    summary: 'Sets the fuel price and the fuel use per acre of each operation.',
    body: fuelCostBody,
    responses: [json('The rates after the change.', costSettingsAnswer)],
  },
  'PUT /api/costs/machines/:id': {
    summary: "Sets or clears a machine's hourly cost (ownership and operating, per engine hour).",
    params: costItemParams,
    body: hourlyCostBody,
    responses: [json('The rates after the change.', costSettingsAnswer)],
  },
  'PUT /api/costs/people/:id': {
    summary: "Sets or clears a person's hourly labour cost.",
    params: costItemParams,
    body: hourlyCostBody,
    responses: [json('The rates after the change.', costSettingsAnswer)],
  },

  // Customers of custom work (owner and viewers read; the owner changes)
  'GET /api/customers': {
    summary: 'Lists the customers of custom work with the fields marked as theirs.',
    responses: [json('The customers.', customerList)],
  },
  'POST /api/customers': {
    summary: 'Adds a customer: name, contact e-mail (invoices go there) and postal address.',
    body: customerBody,
    responses: [json('The customer.', customer, 201)],
  },
  'GET /api/customers/:id': {
    summary: 'Gives one customer with their fields.',
    params: idParam,
    responses: [json('The customer.', customer)],
  },
  'PATCH /api/customers/:id': {
    summary: "Changes a customer's name, e-mail or address.",
    params: idParam,
    body: customerPatchBody,
    responses: [json('The customer.', customer)],
  },
  'DELETE /api/customers/:id': {
    summary: 'Removes a customer who has no invoices; their fields become the farm’s own.',
    params: idParam,
    responses: [noContent('Removed.')],
  },
  'PUT /api/fields/:id/customer': {
    summary: "Marks a field as a customer's (custom work), or the farm's own with null.",
    params: idParam,
    body: fieldCustomerBody,
    responses: [json('Whose field it is now.', fieldCustomerAnswer)],
  },

  // Custom-work rate card (owner and viewers read; the owner sets)
  'GET /api/rate-card': {
    summary: 'Gives the custom-work rate per operation (per acre or per hour), the owner’s own or the published default with its source.',
    responses: [json('The rate card.', rateCard)],
  },
  'PUT /api/rate-card/:operation': {
    summary: "Sets the owner's own custom-work rate for an operation.",
    params: rateParams,
    body: rateBody,
    responses: [json('The rate card after the change.', rateCard)],
  },
  'DELETE /api/rate-card/:operation': {
    summary: 'Returns an operation to the published default rate.',
    params: rateParams,
    responses: [json('The rate card after the change.', rateCard)],
  },

  // Invoices for custom work (owner and viewers read and export; the owner drafts, sends, voids and credits)
  'GET /api/invoices/settings': {
    summary: 'Gives the tax line (name and rate in basis points) and currency new invoices get.',
    responses: [json('The settings.', invoiceSettings)],
  },
  'PUT /api/invoices/settings': {
    summary: 'Sets the tax line and currency for invoices drafted from now on.',
    body: invoiceSettingsBody,
    responses: [json('The settings.', invoiceSettings)],
  },
  'GET /api/invoices/receivables': {
    summary: 'Lists sent invoices neither paid nor credited, oldest first, with the days outstanding and their total.',
    responses: [json('The receivables.', receivables)],
  },
  'GET /api/invoices/payments': {
    summary: 'Lists payments received online, newest first.',
    responses: [json('The payments.', paymentList)],
  },
  'GET /api/invoices/export/:table.csv': {
    summary: 'Downloads the invoices, the receivables or the payments as CSV.',
    params: invoiceExportParams,
    responses: [{ status: 200, description: 'The table as CSV.', contentType: 'text/csv' }],
  },
  'GET /api/invoices': {
    summary: 'Lists invoices and credit notes, newest number first, with number, state, customer and totalCents.',
    responses: [json('The invoices.', invoiceList)],
  },
  'POST /api/invoices': {
    summary:
      "Drafts an invoice from a customer's finished work over a period: one line per job, the tax line, and the farm's next gapless number.",
    body: invoiceDraftBody,
    responses: [json('The draft.', invoiceDetail, 201)],
  },
  'GET /api/invoices/:id': {
    summary: 'Gives one invoice or credit note with its lines, payments, payment link and last payment-service error.',
    params: idParam,
    responses: [json('The invoice.', invoiceDetail)],
  },
  'GET /api/invoices/:id/pdf': {
    summary: 'Gives the invoice or credit note as a PDF.',
    params: idParam,
    responses: [{ status: 200, description: 'The PDF.', contentType: 'application/pdf' }],
  },
  'POST /api/invoices/:id/send': {
    summary:
      'Sends a draft (or retries a sent invoice the payment service failed on): makes its hosted checkout and mails the PDF with the payment link. If the service fails, the invoice stays sent with the reason in paymentError.',
    params: idParam,
    responses: [json('The invoice.', invoiceDetail)],
  },
  'POST /api/invoices/:id/void': {
    summary: 'Voids a draft or an unpaid sent invoice; it keeps its number.',
    params: idParam,
    body: invoiceVoidBody,
    responses: [json('The invoice.', invoiceDetail)],
  },
  'POST /api/invoices/:id/credit': {
    summary: 'Issues a credit note for the whole of a sent or paid invoice, with the next number and negative amounts.',
    params: idParam,
    body: invoiceCreditBody,
    responses: [json('The credit note.', invoiceDetail, 201)],
  },

  // This document
  'GET /api/openapi.json': {
    summary: 'Gives this API description as an OpenAPI 3.1 document.',
    responses: [{ status: 200, description: 'The OpenAPI document.', type: 'OpenAPI 3.1 document' }],
  },
  'GET /api/docs': {
    summary: 'Shows this API description as a plain web page.',
    responses: [{ status: 200, description: 'The reference page.', contentType: 'text/html' }],
  },
};
