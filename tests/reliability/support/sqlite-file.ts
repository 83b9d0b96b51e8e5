import sqlite3 from 'sqlite3';

/**
 * Runs one read query on a SQLite file nobody else has open (the server is dead or stopped),
 * opened read-write so SQLite can roll its write-ahead log forward as any restart would.
 */
export function queryFile<Row>(file: string, sql: string, parameters: unknown[] = []): Promise<Row[]> {
  return new Promise((resolve, reject) => {
    const database = new sqlite3.Database(file, sqlite3.OPEN_READWRITE, (openError) => {
      if (openError) {
        reject(openError);
        return;
      }
      database.all(sql, parameters, (error, rows) => {
        database.close(() => (error ? reject(error) : resolve(rows as Row[])));
      });
    });
  });
}
