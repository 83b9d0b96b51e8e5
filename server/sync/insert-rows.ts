import { literal, type Model, type ModelAttributeColumnOptions, type ModelStatic, type QueryOptions, type Transaction } from 'sequelize';

/** How `insertRows` writes: in which transaction, and which columns an existing row takes on. */
export interface InsertRowsOptions {
  readonly transaction: Transaction;
  /**
   * Columns (attribute names) that replace those of a row already holding the same primary key
   * (`INSERT … ON CONFLICT (pk) DO UPDATE SET`, which SQLite and PostgreSQL both speak). Without
   * them a row that exists already fails the statement, and so the transaction.
   */
  readonly updateOnDuplicate?: readonly string[];
}

/** Minimal view of Sequelize's query generator: escaping a value the way the model's column type does. */
interface ValueEscaper {
  escape(value: unknown, attribute?: unknown): string;
}

/**
 * Writes many rows of one model in a single multi-row INSERT, through the model's own column
 * types (JSON, DATE, BOOLEAN are written exactly as `Model.bulkCreate` writes them), but without
 * building a model instance per row, without RETURNING on PostgreSQL, and with the batch's
 * createdAt/updatedAt escaped once and shared by every row (bulkCreate also gives every row of
 * one call the same time). A sync batch writes three rows per mutation (record, change log,
 * receipt); per-row instances and per-row date formatting were most of its CPU time.
 *
 * Rows are in attribute names; a column left out of every row takes its database default.
 * Model-level validators, setters and hooks do not run: callers pass values already checked
 * (zod at the edge), as they did with bulkCreate, whose `validate` defaults to false.
 */
export async function insertRows(model: ModelStatic<Model>, rows: readonly Record<string, unknown>[], options: InsertRowsOptions): Promise<void> {
  if (rows.length === 0) {
    return;
  }
  const attributes = model.getAttributes() as Record<string, { field?: string; primaryKey?: boolean }>;
  const fieldOf = (name: string): string => attributes[name]?.field ?? name;
  const byField: Record<string, unknown> = {};
  for (const [name, attribute] of Object.entries(attributes)) {
    byField[fieldOf(name)] = attribute;
  }
  const queryInterface = model.sequelize!.getQueryInterface();
  const escaper = (queryInterface as unknown as { queryGenerator: ValueEscaper }).queryGenerator;

  const timestamps: Record<string, unknown> = {};
  const timestampNames = (model as unknown as { _timestampAttributes: { createdAt?: string; updatedAt?: string } })._timestampAttributes;
  const now = new Date();
  for (const name of [timestampNames.createdAt, timestampNames.updatedAt]) {
    if (name) {
      timestamps[fieldOf(name)] = literal(escaper.escape(now, attributes[name]));
    }
  }
  const renames = Object.keys(attributes).filter((name) => fieldOf(name) !== name);
  const records = rows.map((row) => {
    const record: Record<string, unknown> = { ...row, ...timestamps };
    for (const name of renames) {
      if (name in record) {
        record[fieldOf(name)] = record[name];
        delete record[name];
      }
    }
    return record;
  });

  const primaryKey = Object.entries(attributes).filter(([, attribute]) => attribute.primaryKey).map(([name]) => fieldOf(name));
  const updateOnDuplicate = options.updateOnDuplicate
    ?.filter((name) => name !== timestampNames.createdAt && name in attributes)
    .map(fieldOf);
  await queryInterface.bulkInsert(model.getTableName(), records, {
    transaction: options.transaction,
    // Not in QueryOptions' type, but what Model.bulkCreate hands the query generator for an upsert.
    ...(updateOnDuplicate && updateOnDuplicate.length > 0 ? { updateOnDuplicate, upsertKeys: primaryKey } : {}),
  } as QueryOptions, byField as Record<string, ModelAttributeColumnOptions>);
}
