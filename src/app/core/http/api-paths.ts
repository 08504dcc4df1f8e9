import type { Operation } from '@shared/operations';
import type { SeasonTable } from '@shared/schemas/season';

/**
 * Every path of the API the app calls, in one place: a screen asks `API` for a path instead of
 * writing it out, so a path that moves on the server moves here once. Values that go into a path
 * are ids, dates (YYYY-MM-DD), years and names from fixed lists; the one free-text part, an
 * e-mailed token, is encoded.
 */
export const API = {
  config: '/api/config',

  authMe: '/api/auth/me',
  authLogin: '/api/auth/login',
  authLogout: '/api/auth/logout',
  authForgot: '/api/auth/forgot',
  authSetPassword: '/api/auth/set-password',
  authToken: (token: string) => `/api/auth/token/${encodeURIComponent(token)}`,

  farm: '/api/farm',
  members: '/api/members',
  memberInvite: '/api/members/invite',
  member: (id: number) => `/api/members/${id}`,
  backgroundFailed: '/api/background/failed',
  backgroundRetry: (id: string) => `/api/background/failed/${encodeURIComponent(id)}/retry`,

  crew: '/api/crew',
  crewSkill: (membershipId: number, operation: Operation) => `/api/crew/${membershipId}/skills/${operation}`,

  machines: '/api/fleet/machines',
  machine: (id: number) => `/api/fleet/machines/${id}`,
  implements: '/api/fleet/implements',
  implement: (id: number) => `/api/fleet/implements/${id}`,

  fields: '/api/fields',
  /** The fields with their crops of one season. */
  fieldsOfSeason: (season: number) => `/api/fields?season=${season}`,
  field: (id: number) => `/api/fields/${id}`,
  fieldOfSeason: (id: number, season: number) => `/api/fields/${id}?season=${season}`,
  fieldsExport: '/api/fields/export.geojson',
  fieldsImport: '/api/fields/import',
  hazards: (fieldId: number) => `/api/fields/${fieldId}/hazards`,
  hazard: (fieldId: number, hazardId: number) => `/api/fields/${fieldId}/hazards/${hazardId}`,
  crop: (fieldId: number, season: number) => `/api/fields/${fieldId}/crops/${season}`,
  cropCopy: (toSeason: number) => `/api/crop-plans/${toSeason}/copy`,

  plansOfField: (fieldId: number) => `/api/plans?fieldId=${fieldId}`,
  plan: (fieldId: number, operation: Operation) => `/api/plans/${fieldId}/${operation}`,
  planPasses: (fieldId: number, operation: Operation) => `/api/plans/${fieldId}/${operation}/passes.geojson`,

  board: (date: string) => `/api/board?date=${date}`,
  boardOrder: (date: string) => `/api/board/${date}/order`,
  boardPublish: (date: string) => `/api/board/${date}/publish`,
  /** A board day's jobs as ISO 11783-10 task data (owner): a TASKDATA.zip for the tractor's display. */
  boardTaskData: (date: string) => `/api/board/${date}/taskdata.zip`,
  assignments: '/api/assignments',
  assignment: (id: number) => `/api/assignments/${id}`,
  assignmentEvents: (id: number) => `/api/assignments/${id}/events`,
  assignmentProblems: (id: number) => `/api/assignments/${id}/problems`,
  /** One job as ISO 11783-10 task data (owner, the job's operator). */
  assignmentTaskData: (id: number) => `/api/assignments/${id}/taskdata.zip`,
  /** A job's measured coverage: read it for the map, or send a track file (owner, the job's operator). */
  assignmentCoverage: (id: number) => `/api/assignments/${id}/coverage`,
  assignmentTrackPoints: (id: number) => `/api/assignments/${id}/track-points`,
  assignmentPhoneTrackCoverage: (id: number) => `/api/assignments/${id}/coverage/from-phone-track`,

  /** A day's run sheet: the signed-in person's, or (for the owner) another member's. */
  /** A phone's waiting actions, many at once. */
  runSheetOutbox: '/api/run-sheet/outbox',
  runSheet: (date: string, membershipId: number | null = null) =>
    `/api/run-sheet?date=${date}${membershipId === null ? '' : `&membershipId=${membershipId}`}`,

  /** Reports from the field (owner): the open list, and confirm or dismiss one. */
  reports: '/api/reports',
  reportReview: (id: number, action: 'confirm' | 'dismiss') => `/api/reports/${id}/${action}`,

  seasons: '/api/season',
  seasonSummary: (year: number) => `/api/season/${year}/summary`,
  seasonCsv: (year: number, table: SeasonTable) => `/api/season/${year}/export/${table}.csv`,

  /** The farm's weather limits per operation, with the defaults and their sources (read by members, set by the owner). */
  weatherLimits: '/api/weather/limits',
  /** Rates of the farm's own work: fuel, machines, people (read by the owner and viewers, set by the owner). */
  costs: '/api/costs',
  costsFuel: '/api/costs/fuel',
  machineCost: (id: number) => `/api/costs/machines/${id}`,
  personCost: (id: number) => `/api/costs/people/${id}`,

  /** Customers of custom work and which fields are theirs (read by the owner and viewers, changed by the owner). */
  customers: '/api/customers',
  customer: (id: number) => `/api/customers/${id}`,
  fieldCustomer: (fieldId: number) => `/api/fields/${fieldId}/customer`,
  /** The custom-work rate card: per operation per acre or per hour, defaults with their sources. */
  rateCard: '/api/rate-card',
  rate: (operation: Operation) => `/api/rate-card/${operation}`,
  /** Invoices for custom work, their receivables, payments and CSV exports (owner and viewers; operators never). */
  invoices: '/api/invoices',
  invoice: (id: number) => `/api/invoices/${id}`,
  invoicePdf: (id: number) => `/api/invoices/${id}/pdf`,
  invoiceAction: (id: number, action: 'send' | 'void' | 'credit') => `/api/invoices/${id}/${action}`,
  invoiceSettings: '/api/invoices/settings',
  receivables: '/api/invoices/receivables',
  invoicePayments: '/api/invoices/payments',
  invoicesCsv: (table: 'invoices' | 'receivables' | 'payments') => `/api/invoices/export/${table}.csv`,
} as const;
