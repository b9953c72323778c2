import { env } from '$env/dynamic/private';
import { openDatabase } from './client';

export const DEFAULT_DATABASE_URL = './data/bandwright.db';

const opened = openDatabase(env.DATABASE_URL || DEFAULT_DATABASE_URL);

export const db = opened.db;
export const sqlite = opened.sqlite;
