// Fleet (machines and implements) and crew skills: request bodies and the shapes the API answers.
import * as z from 'zod';
import { dbId, dbIdNumber } from './common';
import { OPERATION_INFO, OPERATIONS, type Operation } from '../operations';
import type { ImplementKind } from '../plan/implement-defaults';

export const MACHINE_KINDS = ['tractor-4wd', 'tractor-mfwd', 'combine', 'sprayer-sp', 'swather-sp'] as const;
export type MachineKind = (typeof MACHINE_KINDS)[number];

export const MACHINE_KIND_LABELS: Record<MachineKind, string> = {
  'tractor-4wd': '4WD tractor',
  'tractor-mfwd': 'MFWD tractor',
  combine: 'Combine',
  'sprayer-sp': 'Self-propelled sprayer',
  'swather-sp': 'Self-propelled swather',
};

/** Machines that carry their own header or boom: they take only implements that name them. */
export const SELF_PROPELLED: readonly MachineKind[] = ['combine', 'sprayer-sp', 'swather-sp'];

export const IMPLEMENT_KIND_LABELS: Record<ImplementKind, string> = {
  harrow: 'Harrow',
  'air-drill': 'Air drill',
  sprayer: 'Sprayer boom',
  swather: 'Swather header',
  'combine-header': 'Combine header',
  baler: 'Baler',
  disk: 'Disk',
  cultivator: 'Cultivator',
};
export const IMPLEMENT_KINDS = Object.keys(IMPLEMENT_KIND_LABELS) as [ImplementKind, ...ImplementKind[]];

/** Per operation: `qualified` works alone, `learning` needs a mentor, `mentor` is qualified and may teach. */
export const SKILL_LEVELS = ['qualified', 'learning', 'mentor'] as const;
export type SkillLevel = (typeof SKILL_LEVELS)[number];

const name = z.string().trim().min(1, 'Give it a name').max(80, 'Use at most 80 characters');
const notes = z.string().trim().max(1000, 'Use at most 1000 characters').nullable().optional();
const hours = (what: string) =>
  z
    .number({ message: `${what} must be a number of hours` })
    .min(0, `${what} cannot be negative`)
    .max(200_000, `${what} is at most 200,000 h`);
const operation = z.enum(OPERATIONS, { message: `Operation must be one of: ${OPERATIONS.join(', ')}` });

export const machineBody = z.object({
  name,
  kind: z.enum(MACHINE_KINDS, { message: `Kind must be one of: ${MACHINE_KINDS.join(', ')}` }),
  powerHp: z
    .number({ message: 'Power must be a number of horsepower' })
    .positive('Power must be more than 0 hp')
    .max(2000, 'Power is at most 2000 hp'),
  engineHours: hours('The engine-hour meter').default(0),
  serviceIntervalHours: z
    .number()
    .positive('The service interval must be more than 0 h')
    .max(10_000, 'The service interval is at most 10,000 h')
    .nullable()
    .optional(),
  hoursAtLastService: hours('Hours at the last service').nullable().optional(),
  notes,
});
export type MachineInput = z.infer<typeof machineBody>;

export const machinePatchBody = machineBody
  .omit({ engineHours: true })
  .extend({ engineHours: hours('The engine-hour meter') })
  .partial()
  .refine((v) => Object.keys(v).length > 0, 'Nothing to change');

export const implementBody = z
  .object({
    name,
    kind: z.enum(IMPLEMENT_KINDS, { message: `Kind must be one of: ${IMPLEMENT_KINDS.join(', ')}` }),
    widthM: z
      .number({ message: 'Working width must be a number of metres' })
      .positive('Working width must be more than 0')
      .max(60, 'Working width is at most 60 m (197 ft)'),
    transportWidthM: z
      .number()
      .positive('Transport width must be more than 0')
      .max(20, 'Transport width is at most 20 m')
      .nullable()
      .optional(),
    operations: z.array(operation).min(1, 'Choose at least one operation it does'),
    /** Machines that may pull or carry it; empty means any tractor with enough power. */
    machineIds: z.array(dbIdNumber).max(50).default([]),
    minPowerHp: z.number().positive('Minimum power must be more than 0 hp').max(2000).nullable().optional(),
    notes,
  })
  .superRefine((v, ctx) => {
    v.operations.forEach((op, i) => {
      if (!OPERATION_INFO[op].implementKinds.includes(v.kind)) {
        ctx.addIssue({
          code: 'custom',
          path: ['operations', i],
          message: `A ${IMPLEMENT_KIND_LABELS[v.kind].toLowerCase()} cannot do ${OPERATION_INFO[op].label.toLowerCase()}`,
        });
      }
    });
  });
export type ImplementInput = z.infer<typeof implementBody>;

/** A patch is checked as a whole after merging with the stored implement (kind and operations go together). */
export const implementPatchBody = z
  .object({
    name: name.optional(),
    kind: z.enum(IMPLEMENT_KINDS, { message: `Kind must be one of: ${IMPLEMENT_KINDS.join(', ')}` }).optional(),
    widthM: z.number().positive('Working width must be more than 0').max(60, 'Working width is at most 60 m (197 ft)').optional(),
    transportWidthM: z.number().positive('Transport width must be more than 0').max(20).nullable().optional(),
    operations: z.array(operation).min(1, 'Choose at least one operation it does').optional(),
    machineIds: z.array(dbIdNumber).max(50).optional(),
    minPowerHp: z.number().positive('Minimum power must be more than 0 hp').max(2000).nullable().optional(),
    notes,
  })
  .refine((v) => Object.keys(v).length > 0, 'Nothing to change');

export const skillBody = z.object({
  level: z.enum([...SKILL_LEVELS, 'none'], { message: 'Level must be qualified, learning, mentor or none' }),
});

export const skillParams = z.object({
  membershipId: dbId,
  operation,
});

export interface Machine {
  id: number;
  name: string;
  kind: MachineKind;
  powerHp: number;
  /** Engine-hour meter reading, h. */
  engineHours: number;
  serviceIntervalHours: number | null;
  hoursAtLastService: number | null;
  /** Hours left before the next service; negative = overdue; null when no interval is set. */
  serviceDueInHours: number | null;
  /** Plain words when the service is due soon or overdue, else null. */
  serviceWarning: string | null;
  notes: string | null;
}

export interface Implement {
  id: number;
  name: string;
  kind: ImplementKind;
  /** Working width, metres (the app converts to feet for US units). */
  widthM: number;
  transportWidthM: number | null;
  operations: Operation[];
  machineIds: number[];
  minPowerHp: number | null;
  notes: string | null;
}

export interface CrewMember {
  membershipId: number;
  name: string;
  role: 'owner' | 'operator' | 'viewer';
  /** Only the operations with a level; a missing operation means not trained for it. */
  skills: Partial<Record<Operation, SkillLevel>>;
}
