import type { ComponentCategory, InstallScope } from '@shared/schemas/fleet';

/*
 * Shapes of the fleet records as the API sends them (server/modules/fleet, accounts repository).
 * DECIMAL columns arrive as numbers; dates are ISO strings.
 */

export interface Contact {
  id: number;
  accountId: number;
  name: string;
  roleOnFarm: string | null;
  email: string | null;
  phone: string | null;
  reminderOptIn: boolean;
  unsubscribedAt: string | null;
  version: number;
  updatedAt: string;
}

export interface FarmSite {
  id: number;
  accountId: number;
  name: string;
  lat: number;
  lng: number;
  notes: string | null;
  version: number;
  updatedAt: string;
}

export interface Tractor {
  id: number;
  accountId: number;
  name: string;
  modelYear: number | null;
  hydraulicFlowGpm: number;
  hydraulicPressurePsi: number;
  remoteValves: number;
  ptoHp: number | null;
  version: number;
  updatedAt: string;
}

/** The planter's own fields, as stored. */
export interface PlanterRecord {
  id: number;
  accountId: number;
  tractorId: number | null;
  farmSiteId: number | null;
  name: string;
  maker: string | null;
  modelYear: number | null;
  rows: number;
  rowSpacingIn: number;
  frameType: string;
  foldType: string;
  seedSupplyType: string;
  seedCapacityUnits: number | null;
  liquidTankCount: number;
  liquidTankGallons: number;
  dryCapacityLb: number;
  markers: boolean;
  acresPerYear: number | null;
  version: number;
  updatedAt: string;
}

/** A planter as listed on its account's page: with the number of parts on it now. */
export interface AccountPlanter extends PlanterRecord {
  installCount: number;
}

export interface Toolbar {
  id: number;
  planterId: number;
  position: number;
  name: string;
  sizeFt: number;
  firstRow: number;
  lastRow: number;
}

export interface CatalogComponent {
  id: number;
  category: ComponentCategory;
  name: string;
  maker: string | null;
  partNumber: string;
  priceUsd: number;
  labourHours: number;
  expectedLifeYears: number;
  unit: 'row' | 'toolbar' | 'planter';
  hydraulicGpm: number | null;
  ratedMaxSpeedMph: number | null;
  maxSeedsPerSecond: number | null;
  crops: string[];
  movesToNewToolbar: boolean;
  active: boolean;
  version: number;
  updatedAt: string;
}

export interface Install {
  id: number;
  planterId: number;
  componentId: number;
  scope: InstallScope;
  toolbarId: number | null;
  rowFrom: number | null;
  rowTo: number | null;
  quantity: number;
  installDate: string | null;
  pricePaidUsd: number | null;
  serialNumbers: string[];
  workOrder: string | null;
  status: 'installed' | 'removed';
  removedDate: string | null;
  removedReason: string | null;
  version: number;
  updatedAt: string;
  component: CatalogComponent | null;
}

export interface PlanterDetail extends PlanterRecord {
  accountName: string;
  toolbars: Toolbar[];
  tractor: Tractor | null;
  installs: Install[];
}

export interface AuditEntry {
  id: number;
  at: string;
  entity: string;
  entityId: number | null;
  action: string;
  summary: string | null;
  changes: Record<string, unknown> | null;
  userId: number | null;
  userName: string | null;
}

export type AttachmentOwnerType = 'account' | 'planter' | 'install';

export interface Attachment {
  id: number;
  accountId: number;
  ownerType: AttachmentOwnerType;
  ownerId: number;
  originalName: string;
  mime: string;
  sizeBytes: number;
  isImage: boolean;
  uploadedBy: number | null;
  uploadedByName: string | null;
  createdAt: string;
  fileUrl: string;
  thumbUrl: string | null;
}
