/** Every model, initialised on one Sequelize instance with its associations. */
import type { Sequelize } from 'sequelize';
import { AuditLog } from './audit-log.js';
import { ImportBatch } from './import-batch.js';
import { ImportMapping } from './import-mapping.js';
import { ImportRow } from './import-row.js';
import { Motor } from './motor.js';
import { MotorFile } from './motor-file.js';
import { MotorMeasurement } from './motor-measurement.js';
import { Organization } from './organization.js';
import { OutboxAttachment, OutboxMessage } from './outbox-message.js';
import { Site } from './site.js';
import { User } from './user.js';
import { BldcDesign } from './bldc-design.js';
import { Job } from './job.js';
import { Material } from './material.js';
import { OrganizationSettings } from './organization-settings.js';
import { Retrofit } from './retrofit.js';
import { Study } from './study.js';
import { BusinessCase, CaseSend } from './business-case.js';
import { RetrofitEvent, RetrofitFile, RetrofitMeterData } from './retrofit-log.js';

export { AuditLog, ImportBatch, ImportMapping, ImportRow, Motor, MotorFile, MotorMeasurement, Organization, OutboxAttachment, OutboxMessage, Site, User };

export { BldcDesign, Job, Material, OrganizationSettings, Retrofit, Study };

export { BusinessCase, CaseSend };

export { RetrofitEvent, RetrofitFile, RetrofitMeterData };

export function initModels(sequelize: Sequelize): void {
  for (const model of [Organization, User, Site, ImportBatch, Motor, AuditLog, OutboxMessage, OutboxAttachment, MotorMeasurement, MotorFile, ImportRow, ImportMapping]) {
    model.initModel(sequelize);
  }
  for (const model of [OrganizationSettings, Material, Study, BldcDesign, Job, Retrofit]) model.initModel(sequelize);
  for (const model of [BusinessCase, CaseSend]) model.initModel(sequelize);
  for (const model of [RetrofitEvent, RetrofitFile, RetrofitMeterData]) model.initModel(sequelize);
  Organization.hasMany(User, { foreignKey: 'organizationId' });
  User.belongsTo(Organization, { foreignKey: 'organizationId', as: 'organization' });
  Site.hasMany(Motor, { foreignKey: 'siteId', as: 'motors' });
  Motor.belongsTo(Site, { foreignKey: 'siteId', as: 'site' });
  OutboxMessage.hasMany(OutboxAttachment, { foreignKey: 'messageId', as: 'attachments' });
}
