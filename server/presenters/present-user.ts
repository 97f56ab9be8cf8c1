import type { UserDto } from '../../shared/schemas/users';
import type { Shop, User } from '../models';

/** User (with its shop loaded) → the user DTO: never the password hash. */
export function presentUser(user: User, shop: Shop | undefined = user.shop): UserDto {
  if (!shop) throw new Error(`presentUser: shop not loaded for user ${user.id}`);
  return {
    id: user.id,
    email: user.email,
    name: user.name,
    role: user.role,
    active: user.active,
    shop: { id: shop.id, name: shop.name, isDemo: shop.isDemo },
  };
}
