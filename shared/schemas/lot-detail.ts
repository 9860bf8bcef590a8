import type { MaterialReconciliation } from '../domain/manufacturing/material-reconciliation';
import type { UnitChain } from '../domain/manufacturing/unit-chain';
import type { WindowCheck } from '../domain/manufacturing/run-window';
import type { LotSummary, Part } from './manufacturing';

/** What the lot page shows: the whole device history record of one lot. */
export interface MaterialMovement {
  id: number;
  kind: 'issue' | 'return';
  tag: string;
  barPieceId: number;
  heat: { id: number; heatNumber: string; status: string; supplier: string; specId: string };
  lengthMm: string;
  recordedAt: string;
  recordedBy: string;
}

export interface OperationRecord {
  id: number;
  stepNo: number;
  stepName: string;
  kind: string;
  operatorName: string;
  workCentre: string;
  programRevision: string | null;
  startedAt: string;
  endedAt: string;
  qtyIn: number;
  qtyGood: number;
  qtyScrap: number;
  scrapReasons: Array<{ reason: string; qty: number }>;
  sampleSize: number | null;
  defectsFound: number | null;
  verdict: 'accept' | 'reject' | null;
  processRun: { id: number; runNumber: string; inWindow: boolean } | null;
  notes: string | null;
  files: Array<{ documentId: number; name: string; sha256: string }>;
  recordedBy: string;
  recordedAt: string;
}

export interface NonconformanceSummary {
  id: number;
  ncNumber: string;
  subjectType: 'heat' | 'bar-piece' | 'lot' | 'process-run';
  subjectId: number;
  subjectLabel: string;
  lotNumber: string | null;
  runNumber: string | null;
  source: 'raised' | 'run-window';
  description: string;
  containment: string;
  status: 'open' | 'dispositioned' | 'closed';
  disposition: 'use-as-is' | 'rework' | 'scrap' | 'return-to-supplier' | null;
  dispositionNote: string | null;
  raisedBy: string;
  raisedAt: string;
}

export interface LotLink {
  lotId: number;
  lotNumber: string;
  kind: 'split' | 'merge';
  qty: number;
  afterStep: number;
}

export interface ShipmentRecord {
  id: number;
  consignee: { id: number; name: string; kind: string; country: string };
  qty: number;
  shippedOn: string;
  documentNumber: string;
  recordedBy: string;
}

export interface TimelineEntry {
  at: string;
  kind: 'opened' | 'material' | 'operation' | 'run' | 'nonconformance' | 'split' | 'merge' | 'shipment' | 'signature';
  title: string;
  detail: string;
  by: string;
  link: string | null;
}

export interface LotDetail extends LotSummary {
  partRecord: Part;
  startQty: number | null;
  resumesAfterStep: number;
  releasedQty: number;
  material: MaterialMovement[];
  operations: OperationRecord[];
  nextRoutingStep: { stepNo: number; name: string; kind: string } | null;
  parents: LotLink[];
  children: LotLink[];
  nonconformances: NonconformanceSummary[];
  shipments: ShipmentRecord[];
  unitChain: UnitChain;
  materialReconciliation: MaterialReconciliation | null;
  timeline: TimelineEntry[];
  /** Holds not yet lifted: the lot can be neither released, shipped, split nor merged. */
  holds: Array<{ id: number; lotId: number; lotNumber: string; reference: string }>;
}

export interface ProcessRunSummary {
  id: number;
  runNumber: string;
  kind: 'passivation' | 'cleaning';
  methodId: string;
  methodTitle: string;
  equipment: string;
  operatorName: string;
  runAt: string;
  inWindow: boolean;
  lots: number;
  recordedBy: string;
}

export interface ProcessRunDetail extends ProcessRunSummary {
  parameters: Record<string, string>;
  windowCheck: WindowCheck;
  lotsInRun: Array<{ lotId: number; lotNumber: string; partNumber: string; qty: number }>;
  nonconformances: NonconformanceSummary[];
}
