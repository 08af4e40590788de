import "server-only";
import type { EntityManager } from "@mikro-orm/postgresql";
import { type TemperatureUnit, type UnitSystem, type User, UserSchema } from "@/entities/user";
import type { AccountInput } from "@/lib/schemas/studio";

export interface AccountDto {
  id: string;
  email: string;
  name: string;
  unitSystem: UnitSystem;
  temperatureUnit: TemperatureUnit;
  mailEnabled: boolean;
  hasPassword: boolean;
}

function accountDto(u: User): AccountDto {
  return {
    id: u.id,
    email: u.email,
    name: u.name,
    unitSystem: u.unitSystem,
    temperatureUnit: u.temperatureUnit,
    mailEnabled: u.mailEnabled,
    hasPassword: Boolean(u.passwordHash),
  };
}

export async function getAccount(em: EntityManager, userId: string): Promise<AccountDto> {
  return accountDto(await em.findOneOrFail(UserSchema, { id: userId }));
}

export async function updateAccount(em: EntityManager, userId: string, input: AccountInput): Promise<AccountDto> {
  const u = await em.findOneOrFail(UserSchema, { id: userId });
  em.assign(u, Object.fromEntries(Object.entries(input).filter(([, v]) => v !== undefined)));
  await em.flush();
  return accountDto(u);
}
