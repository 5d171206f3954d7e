/** What an audit action code means, in words (unknown codes fall back to their parts). */
const ACTION_WORDS: Record<string, string> = {
  'pair.created': 'created a pair',
  'pair.updated': 'changed a pair',
  'pair.archived': 'archived a pair',
  'pair.deleted': 'deleted a pair',
  'cascade.created': 'created a cascade',
  'cascade.updated': 'saved a new version of a cascade',
  'cascade.deleted': 'deleted a cascade',
  'report.create': 'drafted a report',
  'report.delete': 'deleted a report',
  'report.revise': 'revised a report',
  'report.submit': 'submitted a report for review',
  'report.approve': 'approved a report',
  'report.reject': 'sent a report back',
  'report.comment': 'commented on a report',
  'screen.created': 'started a screen',
  'screen.cancelled': 'cancelled a screen',
  'screen.rerun': 're-ran a screen',
  'series.created': 'created a series',
  'series.updated': 'changed a series',
  'series.fitted': 'fitted a series',
  'trace.uploaded': 'uploaded a trace',
  'trace-analysis.created': 'analysed a trace',
  'workspace.created': 'created the workspace',
  'workspace.renamed': 'renamed the workspace',
  'member.role-changed': 'changed a role',
  'member.removed': 'removed a member',
  'member.left': 'left the workspace',
  'invitation.created': 'invited someone',
  'invitation.accepted': 'accepted an invitation',
  'invitation.revoked': 'revoked an invitation',
};

export function actionWords(action: string): string {
  const known = ACTION_WORDS[action];
  if (known) return known;
  const [record, verb] = action.split('.');
  return verb ? `${verb.replace(/-/g, ' ')} (${record.replace(/-/g, ' ')})` : action;
}
