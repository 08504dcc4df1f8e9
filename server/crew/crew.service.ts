// The crew and what each person may do per operation: qualified, learning (needs a mentor on
// the job) or mentor. The work board reads these to find a learner without a mentor.
import type { Operation } from '../../shared/operations';
import type { CrewMember, SkillLevel } from '../../shared/schemas/fleet';
import type { AppDeps } from '../app-deps';
import { AppError, notFound } from '../http/errors';
import * as repo from './crew.repository';

export async function listCrew(deps: AppDeps, farmId: number): Promise<CrewMember[]> {
  const [people, skills] = await Promise.all([repo.listCrew(deps.db, farmId), repo.skillsOfFarm(deps.db, farmId)]);
  return people.map((p) => ({
    membershipId: p.membership_id,
    name: p.name,
    role: p.role,
    skills: Object.fromEntries(skills.filter((s) => s.membership_id === p.membership_id).map((s) => [s.operation, s.level])),
  }));
}

export async function setSkill(
  deps: AppDeps,
  farmId: number,
  membershipId: number,
  operation: Operation,
  level: SkillLevel | 'none',
): Promise<CrewMember> {
  const person = await repo.getCrewMember(deps.db, farmId, membershipId);
  if (!person) throw notFound('That crew member');
  if (person.role === 'viewer' && level !== 'none') {
    throw new AppError(422, 'viewer_cannot_operate', `${person.name} is a viewer; make them an operator before giving them field work`);
  }
  await repo.setSkill(deps.db, farmId, membershipId, operation, level);
  return (await listCrew(deps, farmId)).find((c) => c.membershipId === membershipId)!;
}
