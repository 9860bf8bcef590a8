import { CreateOrganisation1764633600000 } from './1764633600000-create-organisation';
import { CreatePeopleAndSessions1764640800000 } from './1764640800000-create-people-and-sessions';
import { CreateAuditLedger1764644400000 } from './1764644400000-create-audit-ledger';
import { CreateElectronicSignatures1764648000000 } from './1764648000000-create-electronic-signatures';
import { CreateMaterialIntake1764651600000 } from './1764651600000-create-material-intake';
import { CreateBarStock1764655200000 } from './1764655200000-create-bar-stock';
import { CreateSpecificationDrafts1764658800000 } from './1764658800000-create-specification-drafts';
import { CreateManufacturingRecord1764662400000 } from './1764662400000-create-manufacturing-record';
import { CreateRelease1764666000000 } from './1764666000000-create-release';
import { CreateMailOutbox1764669600000 } from './1764669600000-create-mail-outbox';
import { CreateRecall1764673200000 } from './1764673200000-create-recall';
import { CreateLotHeat1764676800000 } from './1764676800000-create-lot-heat';
import { CreateRateLimit1764680400000 } from './1764680400000-create-rate-limit';
import { CreateScreeningAcknowledgement1764684000000 } from './1764684000000-create-screening-acknowledgement';
import { CreateCheckAnalysis1764691200000 } from './1764691200000-create-check-analysis';
import { AddBarHeatMarking1764687600000 } from './1764687600000-add-bar-heat-marking';
import { AddCannotBeEvaluated1764694800000 } from './1764694800000-add-cannot-be-evaluated';
import { AddContactCategoryAndMethodValidation1764698400000 } from './1764698400000-add-contact-category-and-method-validation';
import { AddRoleChangeConfirmation1764702000000 } from './1764702000000-add-role-change-confirmation';
import { AddLedgerSignatures1764705600000 } from './1764705600000-add-ledger-signatures';
import { AddPartRecallTrigger1764709200000 } from './1764709200000-add-part-recall-trigger';
import { AddPlantTimeZone1764712800000 } from './1764712800000-add-plant-time-zone';
import { NameReturnedReleaseOutcome1764716400000 } from './1764716400000-name-returned-release-outcome';
import { NameKeyIndexesApart1764720000000 } from './1764720000000-name-key-indexes-apart';
import { CreateFieldAction1764723600000 } from './1764723600000-create-field-action';

/** Every migration in the order it runs. Add new ones at the end. */
export const migrations = [
  CreateOrganisation1764633600000,
  CreatePeopleAndSessions1764640800000,
  CreateAuditLedger1764644400000,
  CreateElectronicSignatures1764648000000,
  CreateMaterialIntake1764651600000,
  CreateBarStock1764655200000,
  CreateSpecificationDrafts1764658800000,
  CreateManufacturingRecord1764662400000,
  CreateRelease1764666000000,
  CreateMailOutbox1764669600000,
  CreateRecall1764673200000,
  CreateLotHeat1764676800000,
  CreateRateLimit1764680400000,
  CreateScreeningAcknowledgement1764684000000,
  AddBarHeatMarking1764687600000,
  CreateCheckAnalysis1764691200000,
  AddCannotBeEvaluated1764694800000,
  AddContactCategoryAndMethodValidation1764698400000,
  AddRoleChangeConfirmation1764702000000,
  AddLedgerSignatures1764705600000,
  AddPartRecallTrigger1764709200000,
  AddPlantTimeZone1764712800000,
  NameReturnedReleaseOutcome1764716400000,
  NameKeyIndexesApart1764720000000,
  CreateFieldAction1764723600000,
];
