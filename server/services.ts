/**
 * Shared services of one server process, created once at boot and handed to every route group and the worker.
 * Each service lives in its own folder (storage/, jobs/, mail/) with a factory taking its dependencies.
 */
import type { Db } from '../db/client';
import type { Auth } from './auth/auth';
import type { Config } from './config';
import { storageFactory } from './storage/storage.service';
import { orphanSweepFactory } from './storage/orphan-sweep';
import { terrainFactory } from './analysis/terrain.service';
import { jobsFactory } from './jobs/jobs.factory';
import { mailFactory } from './mail/mail.service';

export interface Services {
  db: Db;
  auth: Auth;
  config: Config;
  /** Filled in by the service factories as they are added (storage, jobs, mail). */
  [name: string]: unknown;
}

/** A hook run at boot to add a service to `services` and return a cleanup for shutdown. */
export type ServiceFactory = (services: Services) => Promise<(() => Promise<void>) | void>;

/** Service factories in start-up order (storage before jobs, jobs before mail). */
export const serviceFactories: ServiceFactory[] = [storageFactory, orphanSweepFactory, terrainFactory, jobsFactory, mailFactory];
