import type { DataSource } from 'typeorm';
import { rolesAllow } from '@shared/auth/permissions';
import type { Action } from '@shared/auth/permissions';
import { firstPassYield, nonconformanceCounts, releaseLeadTimes } from '@shared/domain/home/plant-figures';
import type { Home, WorkItem } from '@shared/schemas/home';
import type { Person } from '@shared/schemas/people';
import { heatsAwaitingCheck } from '../materials/check-analysis.service';
import { plantTimeZone } from '../organisation/organisation.repository';
import {
  finishedLotsSince,
  nonconformancesSince,
  releasedSince,
  waitingWork,
  type WaitingCount,
} from './home.repository';

interface WorkKind {
  key: string;
  action: Action;
  title: string;
  explanation: string;
  link: string;
  count: (dataSource: DataSource, person: Person) => Promise<WaitingCount>;
}

/** The kinds of work, each shown to the people whose role may do it. */
const workKinds: WorkKind[] = [
  {
    key: 'heats-to-disposition',
    action: 'materials.disposition',
    title: 'Heats to disposition',
    explanation: 'received or quarantined; acknowledge their certificate screening findings and sign a disposition',
    link: '/heats',
    count: (data) => waitingWork.heatsToDisposition(data.manager),
  },
  {
    key: 'check-analyses-due',
    action: 'materials.write',
    title: 'Check analyses due',
    explanation: 'heats whose supplier rule asks for an independent analysis before disposition',
    link: '/heats',
    count: async (data) => {
      const due = await heatsAwaitingCheck(data.manager);
      const oldest = due.map((heat) => heat.receivedAt).sort()[0];
      return { count: due.length, oldest: oldest ? new Date(oldest) : null };
    },
  },
  {
    key: 'lots-in-work',
    action: 'lots.write',
    title: 'Lots in work',
    explanation: 'open lots whose routing is not finished or not yet submitted for release',
    link: '/lots',
    count: (data) => waitingWork.lotsInWork(data.manager),
  },
  {
    key: 'lots-returned',
    action: 'release.submit',
    title: 'Lots returned to engineering',
    explanation: 'sent back from release with a reason; correct and submit again',
    link: '/release',
    count: (data) => waitingWork.lotsReturned(data.manager),
  },
  {
    key: 'lots-to-review',
    action: 'release.review',
    title: 'Lots to review',
    explanation: 'submitted for release; review the checklist, the release content and the audit trail',
    link: '/release',
    count: (data) => waitingWork.lotsToReview(data.manager),
  },
  {
    key: 'lots-to-approve',
    action: 'release.approve',
    title: 'Lots to approve for release',
    explanation: 'reviewed; a QA approver other than the reviewer signs the release',
    link: '/release',
    count: (data) => waitingWork.lotsToApprove(data.manager),
  },
  {
    key: 'nonconformances-to-disposition',
    action: 'nonconformances.disposition',
    title: 'Nonconformances to disposition',
    explanation: 'open; decide Use as is, Rework, Scrap or Return to supplier and sign it',
    link: '/nonconformances',
    count: (data) => waitingWork.nonconformancesToDisposition(data.manager),
  },
  {
    key: 'nonconformances-to-close',
    action: 'nonconformances.disposition',
    title: 'Nonconformances to close',
    explanation: 'disposition signed; close once it is carried out',
    link: '/nonconformances',
    count: (data) => waitingWork.nonconformancesToClose(data.manager),
  },
  {
    key: 'holds-to-lift',
    action: 'holds.lift',
    title: 'Holds to lift',
    explanation: 'lots held by a recall investigation; lift each after its disposition',
    link: '/recalls',
    count: (data) => waitingWork.holdsToLift(data.manager),
  },
  {
    key: 'recalls-open',
    action: 'recall.read',
    title: 'Recall investigations open',
    explanation: 'investigations that have not been closed',
    link: '/recalls',
    count: (data) => waitingWork.openRecalls(data.manager),
  },
  {
    key: 'drills-open',
    action: 'recall.read',
    title: 'Drills open',
    explanation: 'recall exercises that have not been closed',
    link: '/recalls',
    count: (data) => waitingWork.openDrills(data.manager),
  },
  {
    key: 'role-changes',
    action: 'people.manage',
    title: 'Role changes to confirm',
    explanation: 'signing roles asked for by another administrator; confirm or refuse with your signature',
    link: '/administration',
    count: (data, person) => waitingWork.roleChangesToConfirm(data.manager, person.id),
  },
];

const FIGURES_MONTHS = 12;

/** The signed-in person's home: the work waiting for their roles, and the plant's figures for the past year. */
export async function homeFor(dataSource: DataSource, person: Person, now = new Date()): Promise<Home> {
  const kinds = workKinds.filter((kind) => rolesAllow(person.roles, kind.action));
  const counts = await Promise.all(kinds.map((kind) => kind.count(dataSource, person)));
  const work: WorkItem[] = kinds.map((kind, index) => ({
    key: kind.key,
    title: kind.title,
    explanation: kind.explanation,
    count: counts[index]!.count,
    oldestSince: counts[index]!.oldest?.toISOString() ?? null,
    link: kind.link,
  }));
  if (!rolesAllow(person.roles, 'lots.read')) return { work, figures: null };
  const since = new Date(now);
  since.setUTCMonth(since.getUTCMonth() - FIGURES_MONTHS);
  const [timeZone, released, nonconformances, finished] = await Promise.all([
    plantTimeZone(dataSource.manager),
    releasedSince(dataSource.manager, since),
    nonconformancesSince(dataSource.manager, since),
    finishedLotsSince(dataSource.manager, since),
  ]);
  return {
    work,
    figures: {
      sinceDay: since.toISOString().slice(0, 10),
      releaseLeadTime: releaseLeadTimes(released, timeZone),
      nonconformances: nonconformanceCounts(nonconformances),
      firstPassYield: firstPassYield(finished),
    },
  };
}
