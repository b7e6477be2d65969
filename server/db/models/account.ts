import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { AccountStatus, AcresByCrop } from '../../../shared/schemas/accounts.js';

/** A grower operation: the customer record every fleet, goal and visit hangs from. */
export class Account extends Model<InferAttributes<Account>, InferCreationAttributes<Account>> {
  declare id: CreationOptional<number>;
  declare name: string;
  declare status: CreationOptional<AccountStatus>;
  declare territoryId: number;
  declare specialistId: number | null;
  declare address: string | null;
  declare town: string | null;
  declare state: string | null;
  declare lat: number | null;
  declare lng: number | null;
  declare acresByCrop: CreationOptional<AcresByCrop>;
  declare notes: string | null;
  declare version: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    Account.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        name: { type: DataTypes.STRING(160), allowNull: false },
        status: { type: DataTypes.ENUM('active', 'prospect', 'inactive'), allowNull: false, defaultValue: 'active' },
        territoryId: { type: DataTypes.INTEGER, allowNull: false },
        specialistId: { type: DataTypes.INTEGER, allowNull: true },
        address: { type: DataTypes.STRING(255), allowNull: true },
        town: { type: DataTypes.STRING(120), allowNull: true },
        state: { type: DataTypes.STRING(2), allowNull: true },
        lat: { type: DataTypes.DECIMAL(9, 6), allowNull: true },
        lng: { type: DataTypes.DECIMAL(9, 6), allowNull: true },
        acresByCrop: { type: DataTypes.JSON, allowNull: false, defaultValue: {} },
        notes: { type: DataTypes.TEXT, allowNull: true },
        version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'accounts', version: true },
    );
  }
}
