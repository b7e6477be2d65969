// Roadmap, visits and settings. DECIMAL columns come back as numbers (decimalAsNumber).
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

const ts = { createdAt: DataTypes.DATE, updatedAt: DataTypes.DATE };
const id = { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true };
const version = { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 };
const int = (allowNull = false) => ({ type: DataTypes.INTEGER, allowNull });
const dec = (p: number, s: number, allowNull = false) => ({ type: DataTypes.DECIMAL(p, s), allowNull });
const str = (n: number, allowNull = false) => ({ type: DataTypes.STRING(n), allowNull });

export class Setting extends Model<InferAttributes<Setting>, InferCreationAttributes<Setting>> {
  declare key: string;
  declare value: unknown;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  static initModel(sequelize: Sequelize) {
    Setting.init({ key: { type: DataTypes.STRING(60), primaryKey: true }, value: { type: DataTypes.JSON, allowNull: false }, ...ts }, { sequelize, tableName: 'settings' });
  }
}

export type RuleKind = 'requires' | 'conflicts-with' | 'supersedes' | 'provides' | 'prepares-for';
export class ComponentRule extends Model<InferAttributes<ComponentRule>, InferCreationAttributes<ComponentRule>> {
  declare id: CreationOptional<number>;
  declare componentId: number;
  declare kind: RuleKind;
  declare targetComponentId: number | null;
  declare capability: string | null;
  declare labourHoursSavedPerUnit: number | null;
  declare partsUsdSavedPerUnit: number | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  static initModel(sequelize: Sequelize) {
    ComponentRule.init(
      {
        id,
        componentId: int(),
        kind: str(20),
        targetComponentId: int(true),
        capability: str(40, true),
        labourHoursSavedPerUnit: dec(6, 2, true),
        partsUsdSavedPerUnit: dec(10, 2, true),
        ...ts,
      },
      { sequelize, tableName: 'component_rules' },
    );
  }
}

export class Goal extends Model<InferAttributes<Goal>, InferCreationAttributes<Goal>> {
  declare id: CreationOptional<number>;
  declare accountId: number;
  declare planterId: number | null;
  declare kind: string;
  declare label: string;
  declare capabilities: string[];
  declare targetSeason: number;
  declare priority: number;
  declare targetValue: number | null;
  declare notes: string | null;
  declare version: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  static initModel(sequelize: Sequelize) {
    Goal.init(
      {
        id,
        accountId: int(),
        planterId: int(true),
        kind: str(30),
        label: str(160),
        capabilities: { type: DataTypes.JSON, allowNull: false, defaultValue: [] },
        targetSeason: { type: DataTypes.SMALLINT, allowNull: false },
        priority: { type: DataTypes.TINYINT, allowNull: false, defaultValue: 2 },
        targetValue: dec(10, 2, true),
        notes: { type: DataTypes.TEXT, allowNull: true },
        version,
        ...ts,
      },
      { sequelize, tableName: 'goals', version: true },
    );
  }
}

export class SeasonBudget extends Model<InferAttributes<SeasonBudget>, InferCreationAttributes<SeasonBudget>> {
  declare accountId: number;
  declare season: number;
  declare budgetUsd: number;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  static initModel(sequelize: Sequelize) {
    SeasonBudget.init(
      { accountId: { type: DataTypes.INTEGER, primaryKey: true }, season: { type: DataTypes.SMALLINT, primaryKey: true }, budgetUsd: dec(12, 2), ...ts },
      { sequelize, tableName: 'season_budgets' },
    );
  }
}

export class PlannedReplacement extends Model<InferAttributes<PlannedReplacement>, InferCreationAttributes<PlannedReplacement>> {
  declare id: CreationOptional<number>;
  declare accountId: number;
  declare planterId: number;
  declare season: number;
  declare kind: 'toolbar' | 'planter';
  declare notes: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  static initModel(sequelize: Sequelize) {
    PlannedReplacement.init(
      { id, accountId: int(), planterId: int(), season: { type: DataTypes.SMALLINT, allowNull: false }, kind: str(10), notes: str(255, true), ...ts },
      { sequelize, tableName: 'planned_replacements' },
    );
  }
}

export const roadmapStages = ['idea', 'proposed', 'quoted', 'accepted', 'ordered', 'installed', 'declined'] as const;
export type RoadmapStage = (typeof roadmapStages)[number];

export class RoadmapItem extends Model<InferAttributes<RoadmapItem>, InferCreationAttributes<RoadmapItem>> {
  declare id: CreationOptional<number>;
  declare accountId: number;
  declare planterId: number;
  declare componentId: number;
  declare season: number;
  declare quantity: number;
  declare partsUsd: number;
  declare labourHours: number;
  declare labourUsd: number;
  declare stage: CreationOptional<RoadmapStage>;
  declare probabilityOverride: number | null;
  declare locked: CreationOptional<boolean>;
  declare goalIds: number[];
  declare explanation: string | null;
  declare specialistId: number | null;
  declare installWeek: string | null;
  declare stageChangedAt: Date | null;
  declare version: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  static initModel(sequelize: Sequelize) {
    RoadmapItem.init(
      {
        id,
        accountId: int(),
        planterId: int(),
        componentId: int(),
        season: { type: DataTypes.SMALLINT, allowNull: false },
        quantity: { type: DataTypes.SMALLINT, allowNull: false },
        partsUsd: dec(12, 2),
        labourHours: dec(8, 2),
        labourUsd: dec(12, 2),
        stage: { type: DataTypes.STRING(10), allowNull: false, defaultValue: 'idea' },
        probabilityOverride: dec(4, 3, true),
        locked: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        goalIds: { type: DataTypes.JSON, allowNull: false, defaultValue: [] },
        explanation: { type: DataTypes.TEXT, allowNull: true },
        specialistId: int(true),
        installWeek: { type: DataTypes.DATEONLY, allowNull: true },
        stageChangedAt: { type: DataTypes.DATE, allowNull: true },
        version,
        ...ts,
      },
      { sequelize, tableName: 'roadmap_items', version: true },
    );
  }
}

export class RoadmapVersion extends Model<InferAttributes<RoadmapVersion>, InferCreationAttributes<RoadmapVersion>> {
  declare id: CreationOptional<number>;
  declare accountId: number;
  declare name: string;
  declare snapshot: unknown;
  declare createdBy: number | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  static initModel(sequelize: Sequelize) {
    RoadmapVersion.init(
      { id, accountId: int(), name: str(120), snapshot: { type: DataTypes.JSON, allowNull: false }, createdBy: int(true), ...ts },
      { sequelize, tableName: 'roadmap_versions' },
    );
  }
}

export class Quote extends Model<InferAttributes<Quote>, InferCreationAttributes<Quote>> {
  declare id: CreationOptional<number>;
  declare accountId: number;
  declare season: number;
  declare itemIds: number[];
  declare partsUsd: number;
  declare labourUsd: number;
  declare totalUsd: number;
  declare validUntil: string;
  declare status: CreationOptional<'open' | 'accepted' | 'declined' | 'expired'>;
  declare createdBy: number | null;
  declare decidedBy: number | null;
  declare decidedAt: Date | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  static initModel(sequelize: Sequelize) {
    Quote.init(
      {
        id,
        accountId: int(),
        season: { type: DataTypes.SMALLINT, allowNull: false },
        itemIds: { type: DataTypes.JSON, allowNull: false },
        partsUsd: dec(12, 2),
        labourUsd: dec(12, 2),
        totalUsd: dec(12, 2),
        validUntil: { type: DataTypes.DATEONLY, allowNull: false },
        status: { type: DataTypes.STRING(10), allowNull: false, defaultValue: 'open' },
        createdBy: int(true),
        decidedBy: int(true),
        decidedAt: { type: DataTypes.DATE, allowNull: true },
        ...ts,
      },
      { sequelize, tableName: 'quotes' },
    );
  }
}

export const visitPurposes = ['pre-season-checkup', 'install', 'troubleshooting', 'roadmap-review', 'post-season-review'] as const;
export const visitStatuses = ['requested', 'planned', 'done', 'cancelled'] as const;

export class Visit extends Model<InferAttributes<Visit>, InferCreationAttributes<Visit>> {
  declare id: CreationOptional<number>;
  declare accountId: number;
  declare specialistId: number | null;
  declare planterId: number | null;
  declare purpose: (typeof visitPurposes)[number];
  declare status: CreationOptional<(typeof visitStatuses)[number]>;
  declare startsAt: Date | null;
  declare durationMin: number;
  declare windowStartMin: number | null;
  declare windowEndMin: number | null;
  declare fixed: CreationOptional<boolean>;
  declare notes: string | null;
  declare checklist: { label: string; done: boolean }[];
  declare roadmapItemIds: number[];
  declare requestedByContactId: number | null;
  declare version: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  static initModel(sequelize: Sequelize) {
    Visit.init(
      {
        id,
        accountId: int(),
        specialistId: int(true),
        planterId: int(true),
        purpose: str(20),
        status: { type: DataTypes.STRING(10), allowNull: false, defaultValue: 'requested' },
        startsAt: { type: DataTypes.DATE, allowNull: true },
        durationMin: { type: DataTypes.SMALLINT, allowNull: false, defaultValue: 60 },
        windowStartMin: { type: DataTypes.SMALLINT, allowNull: true },
        windowEndMin: { type: DataTypes.SMALLINT, allowNull: true },
        fixed: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        notes: { type: DataTypes.TEXT, allowNull: true },
        checklist: { type: DataTypes.JSON, allowNull: false, defaultValue: [] },
        roadmapItemIds: { type: DataTypes.JSON, allowNull: false, defaultValue: [] },
        requestedByContactId: int(true),
        version,
        ...ts,
      },
      { sequelize, tableName: 'visits', version: true },
    );
  }
}
