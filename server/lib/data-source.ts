import 'reflect-metadata';
import { DataSource } from 'typeorm';
import { env } from './env';
import { entities } from '../entities';
import { migrations } from '../entities/migrations';

let dataSource: DataSource | undefined;

export function getDataSource(): DataSource {
  if (!dataSource) {
    dataSource = new DataSource({
      type: 'postgres',
      url: env().DATABASE_URL,
      entities,
      migrations,
      synchronize: false,
      logging: false,
      extra: { max: 10 },
    });
  }
  return dataSource;
}

export async function initDataSource(): Promise<DataSource> {
  const ds = getDataSource();
  if (!ds.isInitialized) await ds.initialize();
  return ds;
}

export async function closeDataSource(): Promise<void> {
  if (dataSource?.isInitialized) await dataSource.destroy();
  dataSource = undefined;
}
