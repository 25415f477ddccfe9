// Display wording for values from the API: crop names, statuses, dates and counts.
import type { CropKey, TrialStatus } from '../../shared/schemas/trial';
import type { Role } from '../../shared/schemas/common';

const CROP_NAMES: Record<CropKey, string> = {
  wheat: 'Winter wheat',
  springWheat: 'Spring wheat',
  oats: 'Oats',
  hullessOats: 'Hulless oats',
  barley: 'Barley',
  rye: 'Rye',
  custom: 'Other crop',
};

export function cropName(crop: CropKey | string | null | undefined): string {
  if (!crop) return 'Crop not chosen';
  return CROP_NAMES[crop as CropKey] ?? crop;
}

const STATUS_NAMES: Record<TrialStatus, string> = {
  draft: 'Draft',
  'in-field': 'In the field',
  'harvest-in': 'Harvest in',
  closed: 'Closed',
};

export function trialStatusName(status: TrialStatus): string {
  return STATUS_NAMES[status];
}

const ROLE_NAMES: Record<Role, string> = {
  admin: 'Administrator',
  coordinator: 'Coordinator',
  grower: 'Grower',
  member: 'Member',
};

export function roleName(role: Role): string {
  return ROLE_NAMES[role];
}

export function plural(count: number, one: string, many = `${one}s`): string {
  return `${count} ${count === 1 ? one : many}`;
}

const dateFormat = new Intl.DateTimeFormat('en', {
  day: 'numeric',
  month: 'short',
  year: 'numeric',
});
const dateTimeFormat = new Intl.DateTimeFormat('en', {
  day: 'numeric',
  month: 'short',
  year: 'numeric',
  hour: 'numeric',
  minute: '2-digit',
});

export function formatDate(iso: string | null | undefined): string {
  if (!iso) return '';
  const date = new Date(iso);
  return Number.isNaN(date.getTime()) ? iso : dateFormat.format(date);
}

export function formatDateTime(iso: string | null | undefined): string {
  if (!iso) return '';
  const date = new Date(iso);
  return Number.isNaN(date.getTime()) ? iso : dateTimeFormat.format(date);
}
