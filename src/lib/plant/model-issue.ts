/**
 * One problem in a model file (or a single edit), with where it is. Kept apart from the schema so
 * every checker names it without a loop of imports.
 */
export interface ModelIssue {
  /** JSON path: '$', '$.site.timeZone', '$.units[2].links[0].unit'. */
  readonly path: string;
  readonly message: string;
}
