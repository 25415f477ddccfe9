// What every feature router receives from createApp: database, policies, mail and settings.
import type { DataSource } from 'typeorm';
import type { AppConfig } from '../config/env';
import type { AuthService } from '../auth/auth.service';
import type { InvitationsService } from '../invitations/invitations.service';
import type { Mailer } from '../mail/mailer';
import type { Policies } from '../middleware/access';
import type { Csrf } from '../middleware/csrf';
import type { RouteEntry } from './route-table';

export interface RouterContext {
  config: AppConfig;
  dataSource: DataSource;
  policies: Policies;
  csrf: Csrf;
  table: RouteEntry[];
  mailer: Mailer;
  auth: AuthService;
  invitations: InvitationsService;
}
