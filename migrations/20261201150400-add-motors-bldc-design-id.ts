import { DataTypes } from 'sequelize';
import type { Migration } from '../server/lib/migrator.js';

export const up: Migration = async ({ context: queryInterface }) => {
  // The BLDC design whose part-load curve the motor's BLDC options use in every assessment.
  await queryInterface.addColumn('motors', 'bldc_design_id', {
    type: DataTypes.INTEGER,
    allowNull: true,
    references: { model: 'bldc_designs', key: 'id' },
    onDelete: 'SET NULL',
  });
};

export const down: Migration = async ({ context: queryInterface }) => {
  await queryInterface.removeColumn('motors', 'bldc_design_id');
};
