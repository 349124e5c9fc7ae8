import type { TeamMemberDto, UserDto } from "../../shared/schemas/auth";
import type { User } from "../models/index";

export const presentSessionUser = (u: Express.User): UserDto => ({
  id: u.id,
  email: u.email,
  name: u.name,
  role: u.role,
  companyId: u.companyId,
});

export const presentTeamMember = (u: User): TeamMemberDto => ({
  id: u.id,
  email: u.email,
  name: u.name,
  role: u.role,
  companyId: u.companyId,
  active: u.active,
  createdAt: u.createdAt.toISOString(),
  lastLoginAt: u.lastLoginAt ? u.lastLoginAt.toISOString() : null,
});
