import { describe, expect, it } from 'vitest';
import { assignableRoles, STAFF_ROLES } from './roles';

describe('assignableRoles', () => {
  it('lets an owner hand out every role, a manager every role but owner, and others none', () => {
    expect(assignableRoles('owner')).toEqual([...STAFF_ROLES]);
    expect(assignableRoles('manager')).toEqual(['manager', 'technician', 'league_manager']);
    expect(assignableRoles('technician')).toEqual([]);
    expect(assignableRoles('league_manager')).toEqual([]);
  });
});
