// Fleet records. DECIMAL columns come back as numbers (decimalAsNumber in the connector options).
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

type Base<M extends Model> = InferAttributes<M>;
const ts = { createdAt: DataTypes.DATE, updatedAt: DataTypes.DATE };
const id = { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true };
const version = { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 };
const num = (type = DataTypes.DECIMAL(10, 2), allowNull = false) => ({ type, allowNull });

export class Contact extends Model<Base<Contact>, InferCreationAttributes<Contact>> {
  declare id: CreationOptional<number>;
  declare accountId: number;
  declare name: string;
  declare roleOnFarm: string | null;
  declare email: string | null;
  declare phone: string | null;
  declare reminderOptIn: boolean;
  declare unsubscribedAt: CreationOptional<Date | null>;
  declare version: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  static initModel(sequelize: Sequelize) {
    Contact.init(
      {
        id,
        accountId: { type: DataTypes.INTEGER, allowNull: false },
        name: { type: DataTypes.STRING(120), allowNull: false },
        roleOnFarm: { type: DataTypes.STRING(80), allowNull: true },
        email: { type: DataTypes.STRING(191), allowNull: true },
        phone: { type: DataTypes.STRING(40), allowNull: true },
        reminderOptIn: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
        unsubscribedAt: { type: DataTypes.DATE, allowNull: true },
        version,
        ...ts,
      },
      { sequelize, tableName: 'contacts', version: true },
    );
  }
}

export class FarmSite extends Model<Base<FarmSite>, InferCreationAttributes<FarmSite>> {
  declare id: CreationOptional<number>;
  declare accountId: number;
  declare name: string;
  declare lat: number;
  declare lng: number;
  declare notes: string | null;
  declare version: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  static initModel(sequelize: Sequelize) {
    FarmSite.init(
      {
        id,
        accountId: { type: DataTypes.INTEGER, allowNull: false },
        name: { type: DataTypes.STRING(120), allowNull: false },
        lat: num(DataTypes.DECIMAL(9, 6)),
        lng: num(DataTypes.DECIMAL(9, 6)),
        notes: { type: DataTypes.TEXT, allowNull: true },
        version,
        ...ts,
      },
      { sequelize, tableName: 'farm_sites', version: true },
    );
  }
}

export class Tractor extends Model<Base<Tractor>, InferCreationAttributes<Tractor>> {
  declare id: CreationOptional<number>;
  declare accountId: number;
  declare name: string;
  declare modelYear: number | null;
  declare hydraulicFlowGpm: number;
  declare hydraulicPressurePsi: number;
  declare remoteValves: number;
  declare ptoHp: number | null;
  declare version: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  static initModel(sequelize: Sequelize) {
    Tractor.init(
      {
        id,
        accountId: { type: DataTypes.INTEGER, allowNull: false },
        name: { type: DataTypes.STRING(120), allowNull: false },
        modelYear: { type: DataTypes.SMALLINT, allowNull: true },
        hydraulicFlowGpm: num(DataTypes.DECIMAL(6, 1)),
        hydraulicPressurePsi: { type: DataTypes.INTEGER, allowNull: false },
        remoteValves: { type: DataTypes.TINYINT, allowNull: false },
        ptoHp: num(DataTypes.DECIMAL(6, 1), true),
        version,
        ...ts,
      },
      { sequelize, tableName: 'tractors', version: true },
    );
  }
}

export class Planter extends Model<Base<Planter>, InferCreationAttributes<Planter>> {
  declare id: CreationOptional<number>;
  declare accountId: number;
  declare tractorId: number | null;
  declare farmSiteId: number | null;
  declare name: string;
  declare maker: string | null;
  declare modelYear: number | null;
  declare rows: number;
  declare rowSpacingIn: number;
  declare frameType: string;
  declare foldType: string;
  declare seedSupplyType: string;
  declare seedCapacityUnits: number | null;
  declare liquidTankCount: number;
  declare liquidTankGallons: number;
  declare dryCapacityLb: number;
  declare markers: boolean;
  declare acresPerYear: number | null;
  declare version: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  static initModel(sequelize: Sequelize) {
    Planter.init(
      {
        id,
        accountId: { type: DataTypes.INTEGER, allowNull: false },
        tractorId: { type: DataTypes.INTEGER, allowNull: true },
        farmSiteId: { type: DataTypes.INTEGER, allowNull: true },
        name: { type: DataTypes.STRING(120), allowNull: false },
        maker: { type: DataTypes.STRING(80), allowNull: true },
        modelYear: { type: DataTypes.SMALLINT, allowNull: true },
        rows: { type: DataTypes.TINYINT.UNSIGNED, allowNull: false },
        rowSpacingIn: num(DataTypes.DECIMAL(5, 2)),
        frameType: { type: DataTypes.STRING(30), allowNull: false },
        foldType: { type: DataTypes.STRING(30), allowNull: false },
        seedSupplyType: { type: DataTypes.STRING(30), allowNull: false },
        seedCapacityUnits: num(DataTypes.DECIMAL(7, 1), true),
        liquidTankCount: { type: DataTypes.TINYINT, allowNull: false, defaultValue: 0 },
        liquidTankGallons: num(DataTypes.DECIMAL(7, 1)),
        dryCapacityLb: num(DataTypes.DECIMAL(8, 1)),
        markers: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        acresPerYear: { type: DataTypes.INTEGER, allowNull: true },
        version,
        ...ts,
      },
      { sequelize, tableName: 'planters', version: true },
    );
  }
}

export class Toolbar extends Model<Base<Toolbar>, InferCreationAttributes<Toolbar>> {
  declare id: CreationOptional<number>;
  declare planterId: number;
  declare position: number;
  declare name: string;
  declare sizeFt: number;
  declare firstRow: number;
  declare lastRow: number;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  static initModel(sequelize: Sequelize) {
    Toolbar.init(
      {
        id,
        planterId: { type: DataTypes.INTEGER, allowNull: false },
        position: { type: DataTypes.TINYINT, allowNull: false },
        name: { type: DataTypes.STRING(80), allowNull: false },
        sizeFt: num(DataTypes.DECIMAL(5, 1)),
        firstRow: { type: DataTypes.TINYINT.UNSIGNED, allowNull: false },
        lastRow: { type: DataTypes.TINYINT.UNSIGNED, allowNull: false },
        ...ts,
      },
      { sequelize, tableName: 'toolbars' },
    );
  }
}

export class Component extends Model<Base<Component>, InferCreationAttributes<Component>> {
  declare id: CreationOptional<number>;
  declare category: string;
  declare name: string;
  declare maker: string | null;
  declare partNumber: string;
  declare priceUsd: number;
  declare labourHours: number;
  declare expectedLifeYears: number;
  declare unit: 'row' | 'toolbar' | 'planter';
  declare hydraulicGpm: number | null;
  declare ratedMaxSpeedMph: number | null;
  declare maxSeedsPerSecond: number | null;
  declare crops: string[];
  declare movesToNewToolbar: boolean;
  declare active: CreationOptional<boolean>;
  declare version: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  static initModel(sequelize: Sequelize) {
    Component.init(
      {
        id,
        category: { type: DataTypes.STRING(40), allowNull: false },
        name: { type: DataTypes.STRING(160), allowNull: false },
        maker: { type: DataTypes.STRING(80), allowNull: true },
        partNumber: { type: DataTypes.STRING(40), allowNull: false, unique: true },
        priceUsd: num(),
        labourHours: num(DataTypes.DECIMAL(6, 2)),
        expectedLifeYears: num(DataTypes.DECIMAL(4, 1)),
        unit: { type: DataTypes.STRING(10), allowNull: false },
        hydraulicGpm: num(DataTypes.DECIMAL(6, 2), true),
        ratedMaxSpeedMph: num(DataTypes.DECIMAL(4, 1), true),
        maxSeedsPerSecond: num(DataTypes.DECIMAL(6, 1), true),
        crops: { type: DataTypes.JSON, allowNull: false, defaultValue: [] },
        movesToNewToolbar: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
        active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
        version,
        ...ts,
      },
      { sequelize, tableName: 'components', version: true },
    );
  }
}

export class Install extends Model<Base<Install>, InferCreationAttributes<Install>> {
  declare id: CreationOptional<number>;
  declare planterId: number;
  declare componentId: number;
  declare scope: 'planter' | 'toolbar' | 'rows' | 'all-rows';
  declare toolbarId: number | null;
  declare rowFrom: number | null;
  declare rowTo: number | null;
  declare quantity: number;
  declare installDate: string | null;
  declare pricePaidUsd: number | null;
  declare serialNumbers: string[];
  declare workOrder: string | null;
  declare status: 'installed' | 'removed';
  declare removedDate: string | null;
  declare removedReason: string | null;
  declare version: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  static initModel(sequelize: Sequelize) {
    Install.init(
      {
        id,
        planterId: { type: DataTypes.INTEGER, allowNull: false },
        componentId: { type: DataTypes.INTEGER, allowNull: false },
        scope: { type: DataTypes.STRING(10), allowNull: false },
        toolbarId: { type: DataTypes.INTEGER, allowNull: true },
        rowFrom: { type: DataTypes.TINYINT.UNSIGNED, allowNull: true },
        rowTo: { type: DataTypes.TINYINT.UNSIGNED, allowNull: true },
        quantity: { type: DataTypes.SMALLINT, allowNull: false },
        installDate: { type: DataTypes.DATEONLY, allowNull: true },
        pricePaidUsd: num(DataTypes.DECIMAL(10, 2), true),
        serialNumbers: { type: DataTypes.JSON, allowNull: false, defaultValue: [] },
        workOrder: { type: DataTypes.STRING(40), allowNull: true },
        status: { type: DataTypes.STRING(10), allowNull: false, defaultValue: 'installed' },
        removedDate: { type: DataTypes.DATEONLY, allowNull: true },
        removedReason: { type: DataTypes.STRING(255), allowNull: true },
        version,
        ...ts,
      },
      { sequelize, tableName: 'installs', version: true },
    );
  }
}

export class Attachment extends Model<Base<Attachment>, InferCreationAttributes<Attachment>> {
  declare id: CreationOptional<number>;
  declare accountId: number;
  declare ownerType: 'account' | 'planter' | 'install';
  declare ownerId: number;
  declare originalName: string;
  declare storedName: string;
  declare thumbName: string | null;
  declare mime: string;
  declare sizeBytes: number;
  declare uploadedBy: number | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  static initModel(sequelize: Sequelize) {
    Attachment.init(
      {
        id,
        accountId: { type: DataTypes.INTEGER, allowNull: false },
        ownerType: { type: DataTypes.STRING(10), allowNull: false },
        ownerId: { type: DataTypes.INTEGER, allowNull: false },
        originalName: { type: DataTypes.STRING(255), allowNull: false },
        storedName: { type: DataTypes.STRING(80), allowNull: false, unique: true },
        thumbName: { type: DataTypes.STRING(80), allowNull: true },
        mime: { type: DataTypes.STRING(60), allowNull: false },
        sizeBytes: { type: DataTypes.INTEGER, allowNull: false },
        uploadedBy: { type: DataTypes.INTEGER, allowNull: true },
        ...ts,
      },
      { sequelize, tableName: 'attachments' },
    );
  }
}

export class AuditEvent extends Model<Base<AuditEvent>, InferCreationAttributes<AuditEvent>> {
  declare id: CreationOptional<number>;
  declare at: Date;
  declare accountId: number | null;
  declare userId: number | null;
  declare entity: string;
  declare entityId: number | null;
  declare action: string;
  declare summary: string | null;
  declare changes: Record<string, unknown> | null;
  static initModel(sequelize: Sequelize) {
    AuditEvent.init(
      {
        id: { type: DataTypes.BIGINT, autoIncrement: true, primaryKey: true },
        at: { type: DataTypes.DATE(3), allowNull: false },
        accountId: { type: DataTypes.INTEGER, allowNull: true },
        userId: { type: DataTypes.INTEGER, allowNull: true },
        entity: { type: DataTypes.STRING(30), allowNull: false },
        entityId: { type: DataTypes.INTEGER, allowNull: true },
        action: { type: DataTypes.STRING(20), allowNull: false },
        summary: { type: DataTypes.STRING(255), allowNull: true },
        changes: { type: DataTypes.JSON, allowNull: true },
      },
      { sequelize, tableName: 'audit_events', timestamps: false },
    );
  }
}
