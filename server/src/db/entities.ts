import { AuditChainHead } from '../modules/ledger/entities/audit-chain-head.entity';
import { AuditEvent } from '../modules/ledger/entities/audit-event.entity';
import { BarPiece } from '../modules/materials/entities/bar-piece.entity';
import { CertificateDocument } from '../modules/materials/entities/certificate-document.entity';
import { CheckAnalysis } from '../modules/materials/entities/check-analysis.entity';
import { CheckAnalysisRule } from '../modules/materials/entities/check-analysis-rule.entity';
import { Consignee } from '../modules/manufacturing/entities/consignee.entity';
import { ElectronicSignature } from '../modules/signatures/entities/electronic-signature.entity';
import { Heat } from '../modules/materials/entities/heat.entity';
import { HeatCertificate } from '../modules/materials/entities/heat-certificate.entity';
import { HeatEvaluation } from '../modules/materials/entities/heat-evaluation.entity';
import { HeatResult } from '../modules/materials/entities/heat-result.entity';
import { HttpSession } from '../modules/auth/entities/http-session.entity';
import { LabelPrint } from '../modules/release/entities/label-print.entity';
import { LotHeat } from '../modules/manufacturing/entities/lot-heat.entity';
import { LotHold } from '../modules/recall/entities/lot-hold.entity';
import { LotLink } from '../modules/manufacturing/entities/lot-link.entity';
import { LotOperation } from '../modules/manufacturing/entities/lot-operation.entity';
import { MailOutbox } from '../modules/mail/entities/mail-outbox.entity';
import { NoticeReply } from '../modules/recall/entities/notice-reply.entity';
import { NoticeReplyLot } from '../modules/recall/entities/notice-reply-lot.entity';
import { RecallFieldAction } from '../modules/recall/entities/recall-field-action.entity';
import { RecallNotice } from '../modules/recall/entities/recall-notice.entity';
import { ReturnedGoodsReceipt } from '../modules/recall/entities/returned-goods-receipt.entity';
import { MaterialMovement } from '../modules/materials/entities/material-movement.entity';
import { Nonconformance } from '../modules/manufacturing/entities/nonconformance.entity';
import { OperationFile } from '../modules/manufacturing/entities/operation-file.entity';
import { Organisation } from '../modules/organisation/entities/organisation.entity';
import { Part } from '../modules/manufacturing/entities/part.entity';
import { PartSpecification } from '../modules/manufacturing/entities/part-specification.entity';
import { Person } from '../modules/people/entities/person.entity';
import { PersonRole } from '../modules/people/entities/person-role.entity';
import { PersonRoleWithdrawal } from '../modules/people/entities/person-role-withdrawal.entity';
import { ProcessMethodValidation } from '../modules/manufacturing/entities/process-method-validation.entity';
import { ProcessRun } from '../modules/manufacturing/entities/process-run.entity';
import { ProductionLot } from '../modules/manufacturing/entities/production-lot.entity';
import { RateLimitWindow } from '../modules/auth/entities/rate-limit-window.entity';
import { Reauthentication } from '../modules/auth/entities/reauthentication.entity';
import { RecallInvestigation } from '../modules/recall/entities/recall-investigation.entity';
import { RecallSnapshot } from '../modules/recall/entities/recall-snapshot.entity';
import { ReleasePacket } from '../modules/release/entities/release-packet.entity';
import { ReleaseSubmission } from '../modules/release/entities/release-submission.entity';
import { RoleChangeRequest } from '../modules/people/entities/role-change-request.entity';
import { RoutingStep } from '../modules/manufacturing/entities/routing-step.entity';
import { SamlAssertionUsed } from '../modules/auth/entities/saml-assertion-used.entity';
import { SamlRequest } from '../modules/auth/entities/saml-request.entity';
import { ScreeningAcknowledgement } from '../modules/materials/entities/screening-acknowledgement.entity';
import { Shipment } from '../modules/manufacturing/entities/shipment.entity';
import { SpecificationDraft } from '../modules/materials/entities/specification-draft.entity';
import { SpecificationRevision } from '../modules/materials/entities/specification-revision.entity';
import { Supplier } from '../modules/materials/entities/supplier.entity';

/** Every entity, listed as imported classes (no globs: tsx emits no decorator metadata for them). */
export const entities = [
  AuditChainHead,
  AuditEvent,
  BarPiece,
  CertificateDocument,
  CheckAnalysis,
  CheckAnalysisRule,
  Consignee,
  ElectronicSignature,
  Heat,
  HeatCertificate,
  HeatEvaluation,
  HeatResult,
  HttpSession,
  LabelPrint,
  LotHeat,
  LotHold,
  LotLink,
  LotOperation,
  MailOutbox,
  NoticeReply,
  NoticeReplyLot,
  RecallFieldAction,
  RecallNotice,
  ReturnedGoodsReceipt,
  MaterialMovement,
  Nonconformance,
  OperationFile,
  Organisation,
  Part,
  PartSpecification,
  Person,
  PersonRole,
  PersonRoleWithdrawal,
  ProcessMethodValidation,
  ProcessRun,
  ProductionLot,
  RateLimitWindow,
  Reauthentication,
  RecallInvestigation,
  RecallSnapshot,
  ReleasePacket,
  ReleaseSubmission,
  RoleChangeRequest,
  RoutingStep,
  SamlAssertionUsed,
  SamlRequest,
  ScreeningAcknowledgement,
  Shipment,
  SpecificationDraft,
  SpecificationRevision,
  Supplier,
];
