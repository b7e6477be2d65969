import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { Role } from '../../../shared/schemas/auth.js';

export class User extends Model<InferAttributes<User>, InferCreationAttributes<User>> {
  declare id: CreationOptional<number>;
  declare email: string;
  declare name: string;
  declare role: Role;
  declare passwordHash: string;
  declare disabled: CreationOptional<boolean>;
  declare accountId: number | null;
  declare lastSignInAt: Date | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    User.init(
      {
        id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
        email: { type: DataTypes.STRING(191), allowNull: false, unique: true },
        name: { type: DataTypes.STRING(120), allowNull: false },
        role: { type: DataTypes.ENUM('admin', 'manager', 'specialist', 'grower'), allowNull: false },
        passwordHash: { type: DataTypes.STRING(100), allowNull: false },
        disabled: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        accountId: { type: DataTypes.INTEGER, allowNull: true },
        lastSignInAt: { type: DataTypes.DATE, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'users' },
    );
  }
}

export class UserTerritory extends Model<InferAttributes<UserTerritory>, InferCreationAttributes<UserTerritory>> {
  declare userId: number;
  declare territoryId: number;

  static initModel(sequelize: Sequelize) {
    UserTerritory.init(
      {
        userId: { type: DataTypes.INTEGER, primaryKey: true },
        territoryId: { type: DataTypes.INTEGER, primaryKey: true },
      },
      { sequelize, tableName: 'user_territories', timestamps: false },
    );
  }
}
