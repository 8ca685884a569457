/** Every model, initialised on one Sequelize instance with its associations. */
import type { Sequelize } from 'sequelize';
import { AuditLog } from './audit-log.js';
import { ImportBatch } from './import-batch.js';
import { Motor } from './motor.js';
import { Organization } from './organization.js';
import { OutboxAttachment, OutboxMessage } from './outbox-message.js';
import { Site } from './site.js';
import { User } from './user.js';

export { AuditLog, ImportBatch, Motor, Organization, OutboxAttachment, OutboxMessage, Site, User };

export function initModels(sequelize: Sequelize): void {
  for (const model of [Organization, User, Site, ImportBatch, Motor, AuditLog, OutboxMessage, OutboxAttachment]) {
    model.initModel(sequelize);
  }
  Organization.hasMany(User, { foreignKey: 'organizationId' });
  User.belongsTo(Organization, { foreignKey: 'organizationId', as: 'organization' });
  Site.hasMany(Motor, { foreignKey: 'siteId', as: 'motors' });
  Motor.belongsTo(Site, { foreignKey: 'siteId', as: 'site' });
  OutboxMessage.hasMany(OutboxAttachment, { foreignKey: 'messageId', as: 'attachments' });
}
