import type { Role } from '../../../shared/auth/roles';
import type { UserDto } from '../../../shared/schemas/users';

let nextId = 100;

/** A user DTO as the API sends it, in an invented shop. */
export function makeUser(overrides: Partial<UserDto> = {}): UserDto {
  const id = nextId++;
  return {
    id,
    email: `person${id}@lugnut-garage.test`,
    name: `Person ${id}`,
    role: 'tech' as Role,
    active: true,
    shop: { id: 7, name: 'Lugnut Garage', isDemo: false },
    ...overrides,
  };
}
