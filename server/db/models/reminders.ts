// Pre-season reminders: season calendar, campaigns, outbox and the local SMTP stand-in's mailbox.
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { CampaignStatus, OutboxStatus } from '../../../shared/schemas/reminders.js';

const ts = { createdAt: DataTypes.DATE, updatedAt: DataTypes.DATE };
const id = { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true };

/** The dealership's own planting window for a region and crop (published defaults are not stored). */
export class SeasonWindow extends Model<InferAttributes<SeasonWindow>, InferCreationAttributes<SeasonWindow>> {
  declare id: CreationOptional<number>;
  declare regionKey: string;
  declare regionLabel: string;
  declare crop: string;
  declare windowStart: string;
  declare windowEnd: string;
  declare source: string | null;
  declare sourceText: string | null;
  declare updatedBy: number | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  static initModel(sequelize: Sequelize) {
    SeasonWindow.init(
      {
        id,
        regionKey: { type: DataTypes.STRING(40), allowNull: false },
        regionLabel: { type: DataTypes.STRING(120), allowNull: false },
        crop: { type: DataTypes.STRING(20), allowNull: false },
        windowStart: { type: DataTypes.CHAR(5), allowNull: false },
        windowEnd: { type: DataTypes.CHAR(5), allowNull: false },
        source: { type: DataTypes.STRING(255), allowNull: true },
        sourceText: { type: DataTypes.TEXT, allowNull: true },
        updatedBy: { type: DataTypes.INTEGER, allowNull: true },
        ...ts,
      },
      { sequelize, tableName: 'season_windows' },
    );
  }
}

export interface StoredAudience {
  growsCrop: boolean;
  hasRoadmapItems: boolean;
  noCheckupSince: string | null;
}

export class ReminderCampaign extends Model<InferAttributes<ReminderCampaign>, InferCreationAttributes<ReminderCampaign>> {
  declare id: CreationOptional<number>;
  declare name: string;
  declare season: number;
  declare regionKey: string;
  declare crop: string;
  declare offsetsDays: number[];
  declare audience: StoredAudience;
  declare subject: string;
  declare body: string;
  declare status: CreationOptional<CampaignStatus>;
  declare createdBy: number | null;
  declare updatedBy: number | null;
  declare version: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  static initModel(sequelize: Sequelize) {
    ReminderCampaign.init(
      {
        id,
        name: { type: DataTypes.STRING(160), allowNull: false },
        season: { type: DataTypes.SMALLINT, allowNull: false },
        regionKey: { type: DataTypes.STRING(40), allowNull: false },
        crop: { type: DataTypes.STRING(20), allowNull: false },
        offsetsDays: { type: DataTypes.JSON, allowNull: false },
        audience: { type: DataTypes.JSON, allowNull: false },
        subject: { type: DataTypes.STRING(200), allowNull: false },
        body: { type: DataTypes.TEXT, allowNull: false },
        status: { type: DataTypes.STRING(10), allowNull: false, defaultValue: 'draft' },
        createdBy: { type: DataTypes.INTEGER, allowNull: true },
        updatedBy: { type: DataTypes.INTEGER, allowNull: true },
        version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        ...ts,
      },
      { sequelize, tableName: 'reminder_campaigns', version: true },
    );
  }
}

export class ReminderCampaignTerritory extends Model<InferAttributes<ReminderCampaignTerritory>, InferCreationAttributes<ReminderCampaignTerritory>> {
  declare campaignId: number;
  declare territoryId: number;
  static initModel(sequelize: Sequelize) {
    ReminderCampaignTerritory.init(
      { campaignId: { type: DataTypes.INTEGER, primaryKey: true }, territoryId: { type: DataTypes.INTEGER, primaryKey: true } },
      { sequelize, tableName: 'reminder_campaign_territories', timestamps: false },
    );
  }
}

/** One message to one contact. The sender claims rows with raw SQL (see server/jobs/sender.ts). */
export class ReminderOutbox extends Model<InferAttributes<ReminderOutbox>, InferCreationAttributes<ReminderOutbox>> {
  declare id: CreationOptional<number>;
  declare campaignId: number;
  declare contactId: number;
  declare accountId: number;
  declare offsetDays: number;
  declare sendOn: string;
  declare toEmail: string;
  declare subject: string;
  declare text: string;
  declare html: string;
  declare messageId: string;
  declare unsubscribeUrl: string;
  declare status: CreationOptional<OutboxStatus>;
  declare attempts: CreationOptional<number>;
  declare nextAttemptAt: Date;
  declare claimedBy: string | null;
  declare lastError: string | null;
  declare smtpResponse: string | null;
  declare sentAt: Date | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  static initModel(sequelize: Sequelize) {
    ReminderOutbox.init(
      {
        id: { type: DataTypes.BIGINT, autoIncrement: true, primaryKey: true },
        campaignId: { type: DataTypes.INTEGER, allowNull: false },
        contactId: { type: DataTypes.INTEGER, allowNull: false },
        accountId: { type: DataTypes.INTEGER, allowNull: false },
        offsetDays: { type: DataTypes.SMALLINT, allowNull: false },
        sendOn: { type: DataTypes.DATEONLY, allowNull: false },
        toEmail: { type: DataTypes.STRING(191), allowNull: false },
        subject: { type: DataTypes.STRING(255), allowNull: false },
        text: { type: DataTypes.TEXT('medium'), allowNull: false },
        html: { type: DataTypes.TEXT('medium'), allowNull: false },
        messageId: { type: DataTypes.STRING(191), allowNull: false },
        unsubscribeUrl: { type: DataTypes.STRING(1000), allowNull: false },
        status: { type: DataTypes.STRING(10), allowNull: false, defaultValue: 'pending' },
        attempts: { type: DataTypes.SMALLINT, allowNull: false, defaultValue: 0 },
        nextAttemptAt: { type: DataTypes.DATE(3), allowNull: false },
        claimedBy: { type: DataTypes.STRING(80), allowNull: true },
        lastError: { type: DataTypes.STRING(1000), allowNull: true },
        smtpResponse: { type: DataTypes.STRING(255), allowNull: true },
        sentAt: { type: DataTypes.DATE(3), allowNull: true },
        ...ts,
      },
      { sequelize, tableName: 'reminder_outbox' },
    );
  }
}

/** A message the local SMTP stand-in received, as the Sent mail page shows it. */
export class ReceivedMail extends Model<InferAttributes<ReceivedMail>, InferCreationAttributes<ReceivedMail>> {
  declare id: CreationOptional<number>;
  declare messageId: string;
  declare envelopeFrom: string | null;
  declare envelopeTo: string[];
  declare fromHeader: string | null;
  declare toHeader: string | null;
  declare subject: string | null;
  declare text: string | null;
  declare html: string | null;
  declare headers: Record<string, string>;
  declare sizeBytes: number;
  declare repeatCount: CreationOptional<number>;
  declare receivedAt: Date;
  static initModel(sequelize: Sequelize) {
    ReceivedMail.init(
      {
        id: { type: DataTypes.BIGINT, autoIncrement: true, primaryKey: true },
        messageId: { type: DataTypes.STRING(191), allowNull: false },
        envelopeFrom: { type: DataTypes.STRING(191), allowNull: true },
        envelopeTo: { type: DataTypes.JSON, allowNull: false },
        fromHeader: { type: DataTypes.STRING(255), allowNull: true },
        toHeader: { type: DataTypes.STRING(1000), allowNull: true },
        subject: { type: DataTypes.STRING(255), allowNull: true },
        text: { type: DataTypes.TEXT('medium'), allowNull: true },
        html: { type: DataTypes.TEXT('medium'), allowNull: true },
        headers: { type: DataTypes.JSON, allowNull: false },
        sizeBytes: { type: DataTypes.INTEGER, allowNull: false },
        repeatCount: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        receivedAt: { type: DataTypes.DATE(3), allowNull: false },
      },
      { sequelize, tableName: 'received_mail', timestamps: false },
    );
  }
}

export const reminderModels = [SeasonWindow, ReminderCampaign, ReminderCampaignTerritory, ReminderOutbox, ReceivedMail];
