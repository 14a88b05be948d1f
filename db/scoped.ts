import {
  AliasNode,
  BinaryOperationNode,
  ColumnNode,
  DeleteQueryNode,
  IdentifierNode,
  InsertQueryNode,
  JoinNode,
  ListNode,
  OnNode,
  OperationNodeTransformer,
  OperatorNode,
  PrimitiveValueListNode,
  ReferenceNode,
  SelectQueryNode,
  TableNode,
  UpdateQueryNode,
  ValueListNode,
  ValueNode,
  ValuesNode,
  WhereNode,
  type Kysely,
  type KyselyPlugin,
  type OperationNode,
  type PluginTransformQueryArgs,
  type QueryId,
  type PluginTransformResultArgs,
  type QueryResult,
  type RootOperationNode,
  type UnknownRow,
} from 'kysely';
import type { Database } from './types';
import { isSpaceTable } from './space-tables';

// The space-scoped query helper. `scoped(db, ctx)` is the same Kysely handle (or transaction) with a
// plugin that writes `space_id = ctx.spaceId` into every query it builds, by construction:
//   - select / update / delete: a condition on every space-owned table in FROM, UPDATE, USING (WHERE),
//     and on every joined space-owned table (in the join's ON, so a left join stays a left join);
//     subqueries and CTEs inside the query are scoped the same way;
//   - insert into a space-owned table: the rows must carry space_id = ctx.spaceId, or the query throws
//     before it reaches the database.
// A query written on the raw handle is refused by tests/unit/tenancy/scoped-queries.test.ts unless it
// carries an `// across spaces: <why>` comment (the sign-in guard, the webhook finding a sale by its
// checkout session, the scheduled sweeps over every space).

declare const inSpace: unique symbol;
/** A handle whose queries are confined to one space. Parameters typed so accept only `scoped()`'s result. */
export type InSpace<D extends Kysely<Database> = Kysely<Database>> = D & { readonly [inSpace]: string };

export class SpaceScopeError extends Error {}

export function scoped<D extends Kysely<Database>>(db: D, ctx: { spaceId: string }): InSpace<D> {
  if (!ctx.spaceId) throw new SpaceScopeError('scoped() needs the caller’s space');
  return db.withPlugin(new SpaceScopePlugin(ctx.spaceId)) as InSpace<D>;
}

/** The table name and the name the query refers to it by, for a FROM / JOIN / UPDATE item. */
function tableOf(node: OperationNode): { table: string; ref: string } | null {
  if (TableNode.is(node)) {
    const name = node.table.identifier.name;
    return { table: name, ref: name };
  }
  if (AliasNode.is(node) && TableNode.is(node.node) && IdentifierNode.is(node.alias))
    return { table: node.node.table.identifier.name, ref: node.alias.name };
  return null;
}

class SpaceScopeTransformer extends OperationNodeTransformer {
  constructor(private readonly spaceId: string) {
    super();
  }

  private condition(ref: string): OperationNode {
    return BinaryOperationNode.create(
      ReferenceNode.create(ColumnNode.create('space_id'), TableNode.create(ref)),
      OperatorNode.create('='),
      ValueNode.create(this.spaceId),
    );
  }

  private conditions(items: readonly OperationNode[] | undefined): OperationNode[] {
    const out: OperationNode[] = [];
    for (const item of items ?? []) {
      const t = tableOf(item);
      if (t && isSpaceTable(t.table)) out.push(this.condition(t.ref));
    }
    return out;
  }

  private where<N extends { where?: WhereNode }>(node: N, conditions: OperationNode[]): N {
    let where = node.where;
    for (const c of conditions) where = where ? WhereNode.cloneWithOperation(where, 'And', c) : WhereNode.create(c);
    return where === node.where ? node : { ...node, where };
  }

  protected override transformSelectQuery(node: SelectQueryNode, queryId?: QueryId): SelectQueryNode {
    const t = super.transformSelectQuery(node, queryId);
    return this.where(t, this.conditions(t.from?.froms));
  }

  protected override transformUpdateQuery(node: UpdateQueryNode, queryId?: QueryId): UpdateQueryNode {
    const t = super.transformUpdateQuery(node, queryId);
    const targets = t.table ? (ListNode.is(t.table) ? t.table.items : [t.table]) : [];
    return this.where(t, [...this.conditions(targets), ...this.conditions(t.from?.froms)]);
  }

  protected override transformDeleteQuery(node: DeleteQueryNode, queryId?: QueryId): DeleteQueryNode {
    const t = super.transformDeleteQuery(node, queryId);
    return this.where(t, [...this.conditions(t.from.froms), ...this.conditions(t.using?.tables)]);
  }

  protected override transformJoin(node: JoinNode, queryId?: QueryId): JoinNode {
    const t = super.transformJoin(node, queryId);
    const [c] = this.conditions([t.table]);
    if (!c) return t;
    // A cross join has no ON: it becomes an inner join on the space, which is the same rows in one space.
    if (!t.on) return JoinNode.createWithOn(t.joinType === 'CrossJoin' ? 'InnerJoin' : t.joinType, t.table, c);
    return { ...t, on: OnNode.cloneWithOperation(t.on, 'And', c) };
  }

  protected override transformInsertQuery(node: InsertQueryNode, queryId?: QueryId): InsertQueryNode {
    const t = super.transformInsertQuery(node, queryId);
    const table = t.into?.table.identifier.name;
    if (table && isSpaceTable(table) && t.values && ValuesNode.is(t.values)) {
      const at = (t.columns ?? []).findIndex((c) => c.column.name === 'space_id');
      if (at < 0) throw new SpaceScopeError(`insert into ${table} without space_id`);
      for (const row of t.values.values) {
        const v = PrimitiveValueListNode.is(row)
          ? row.values[at]
          : ValueListNode.is(row) && ValueNode.is(row.values[at])
            ? row.values[at].value
            : undefined;
        if (v !== this.spaceId) throw new SpaceScopeError(`insert into ${table} for another space`);
      }
    }
    return t;
  }
}

class SpaceScopePlugin implements KyselyPlugin {
  private readonly transformer: SpaceScopeTransformer;
  constructor(spaceId: string) {
    this.transformer = new SpaceScopeTransformer(spaceId);
  }
  transformQuery(args: PluginTransformQueryArgs): RootOperationNode {
    return this.transformer.transformNode(args.node, args.queryId);
  }
  async transformResult(args: PluginTransformResultArgs): Promise<QueryResult<UnknownRow>> {
    return args.result;
  }
}
