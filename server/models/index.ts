import type { Sequelize } from 'sequelize';
import { Shop } from './shop.model';
import { User } from './user.model';
import { Membership } from './membership.model';
import { Invitation } from './invitation.model';
import { PasswordReset } from './password-reset.model';
import { Vehicle } from './vehicle.model';
import { Meter } from './meter.model';
import { Procedure } from './procedure.model';
import { ProcedureVersion } from './procedure-version.model';
import { ReviewComment } from './review-comment.model';
import { Diagnosis } from './diagnosis.model';
import { DiagnosisStep } from './diagnosis-step.model';
import { Attachment } from './attachment.model';
import { CoachingNote } from './coaching-note.model';
import { AuditLog } from './audit-log.model';

export {
  Shop, User, Membership, Invitation, PasswordReset, Vehicle, Meter, Procedure, ProcedureVersion,
  ReviewComment, Diagnosis, DiagnosisStep, Attachment, CoachingNote, AuditLog,
};

let initialised: Sequelize | null = null;

/** Binds every model to one Sequelize instance and wires the associations (once per instance). */
export function initModels(sequelize: Sequelize): void {
  if (initialised === sequelize) return;
  initialised = sequelize;
  for (const m of [Shop, User, Membership, Invitation, PasswordReset, Vehicle, Meter, Procedure,
    ProcedureVersion, ReviewComment, Diagnosis, DiagnosisStep, Attachment, CoachingNote, AuditLog]) {
    m.initModel(sequelize);
  }
  Membership.belongsTo(User, { foreignKey: 'userId', as: 'user' });
  Membership.belongsTo(Shop, { foreignKey: 'shopId', as: 'shop' });
  User.hasMany(Membership, { foreignKey: 'userId', as: 'memberships' });
  Procedure.hasMany(ProcedureVersion, { foreignKey: 'procedureId', as: 'versions' });
  ProcedureVersion.belongsTo(Procedure, { foreignKey: 'procedureId', as: 'procedure' });
  Diagnosis.belongsTo(ProcedureVersion, { foreignKey: 'procedureVersionId', as: 'version' });
  Diagnosis.belongsTo(Vehicle, { foreignKey: 'vehicleId', as: 'vehicle' });
  Diagnosis.belongsTo(User, { foreignKey: 'technicianId', as: 'technician' });
  Diagnosis.hasMany(DiagnosisStep, { foreignKey: 'diagnosisId', as: 'steps' });
  Diagnosis.hasMany(Attachment, { foreignKey: 'diagnosisId', as: 'attachments' });
  Diagnosis.hasMany(CoachingNote, { foreignKey: 'diagnosisId', as: 'coachingNotes' });
}
