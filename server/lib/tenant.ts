/**
 * The one mechanism that scopes data to an organisation. A signed-in request gets a Tenant; services
 * read and write organisation-owned rows only through it, so no query can forget the
 * organisation filter. A row of another organisation is reported as not found (404), never as
 * forbidden, so ids reveal nothing.
 */
import type { Attributes, CountOptions, CreationAttributes, FindAndCountOptions, FindOptions, Model, ModelStatic, Transaction, WhereOptions } from 'sequelize';
import type { SessionUser } from '../shared/auth.js';
import { AuditLog } from '../models/index.js';
import { notFound } from './errors.js';

type Owned = Model & { organizationId: number | null };

export class Tenant {
  readonly organizationId: number;

  constructor(readonly user: SessionUser) {
    this.organizationId = user.organization.id;
  }

  /** A where clause limited to this organisation. */
  where<M extends Owned>(extra: WhereOptions<Attributes<M>> = {}): WhereOptions<Attributes<M>> {
    return { ...(extra as object), organizationId: this.organizationId } as unknown as WhereOptions<Attributes<M>>;
  }

  findAll<M extends Owned>(model: ModelStatic<M>, options: FindOptions<Attributes<M>> = {}): Promise<M[]> {
    return model.findAll({ ...options, where: this.where<M>(options.where as WhereOptions<Attributes<M>>) });
  }

  findAndCountAll<M extends Owned>(model: ModelStatic<M>, options: FindAndCountOptions<Attributes<M>> = {}) {
    return model.findAndCountAll({ ...options, where: this.where<M>(options.where as WhereOptions<Attributes<M>>) });
  }

  count<M extends Owned>(model: ModelStatic<M>, options: CountOptions<Attributes<M>> = {}): Promise<number> {
    return model.count({ ...options, where: this.where<M>(options.where as WhereOptions<Attributes<M>>) });
  }

  /** The row with this id in this organisation, or a 404 naming `what`. */
  async findById<M extends Owned>(
    model: ModelStatic<M>,
    id: number,
    what: string,
    options: Omit<FindOptions<Attributes<M>>, 'where'> = {},
  ): Promise<M> {
    const row = await model.findOne({ ...options, where: this.where<M>({ id } as unknown as WhereOptions<Attributes<M>>) });
    if (!row) throw notFound(what);
    return row;
  }

  /**
   * Creates a row of this organisation. `returningColumns` limits what the INSERT sends back (column
   * names, e.g. to leave out megabytes of JSON the caller already holds); default: every column.
   */
  create<M extends Owned>(model: ModelStatic<M>, values: Omit<CreationAttributes<M>, 'organizationId'>, transaction?: Transaction, returningColumns?: string[]): Promise<M> {
    return model.create({ ...values, organizationId: this.organizationId } as unknown as CreationAttributes<M>, {
      ...(transaction ? { transaction } : {}),
      // Sequelize puts an array `returning` into the SQL as given: column names, not attribute names.
      ...(returningColumns ? { returning: returningColumns as unknown as Array<keyof Attributes<M>> } : {}),
    });
  }

  /** Records who did what to which row, in the caller's transaction. */
  async audit(action: string, entity: string, entityId: number | null, changes: Record<string, unknown> | null, transaction?: Transaction) {
    await AuditLog.create(
      { organizationId: this.organizationId, userId: this.user.id, action, entity, entityId, changes },
      transaction ? { transaction } : {},
    );
  }
}
