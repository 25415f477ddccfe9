// Display wording for values from the API: crop names, statuses, dates and counts.
import type { CropKey, TrialStatus } from '../../shared/schemas/trial';
import type { Role } from '../../shared/schemas/common';
import { onFirstUse } from '../../shared/labels/decimal-text';
import { cropLabel } from '../../shared/labels/labels';

/** A crop's display name; the words live in shared/labels/labels.ts. */
export function cropName(crop: CropKey | string | null | undefined): string {
  return cropLabel(crop);
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

// Made on first use: the first Intl formatter loads the browser's locale data (decimal-text.ts).
const dateFormat = onFirstUse(
  () => new Intl.DateTimeFormat('en', { day: 'numeric', month: 'short', year: 'numeric' }),
);
const dateTimeFormat = onFirstUse(
  () =>
    new Intl.DateTimeFormat('en', {
      day: 'numeric',
      month: 'short',
      year: 'numeric',
      hour: 'numeric',
      minute: '2-digit',
    }),
);

const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'];
const DATE_ONLY = /^(\d{4})-(\d{2})-(\d{2})$/;

/**
 * A calendar date ("2027-04-15" → "Apr 15, 2027") read from its digits, never through a
 * local-time Date: west of UTC that would show the day before. A full timestamp is shown as the
 * day it is in the browser's time zone.
 */
export function formatDate(iso: string | null | undefined): string {
  if (!iso) return '';
  const parts = DATE_ONLY.exec(iso);
  if (parts) {
    const month = MONTHS[Number(parts[2]) - 1];
    return month ? `${month} ${Number(parts[3])}, ${parts[1]}` : iso;
  }
  const date = new Date(iso);
  return Number.isNaN(date.getTime()) ? iso : dateFormat().format(date);
}

export function formatDateTime(iso: string | null | undefined): string {
  if (!iso) return '';
  const date = new Date(iso);
  return Number.isNaN(date.getTime()) ? iso : dateTimeFormat().format(date);
}
