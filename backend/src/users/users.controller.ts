import { Body, Controller, Get, Patch } from '@nestjs/common';
import { CurrentUser, type AuthUser } from '../common/current-user.decorator';
import type { AuditEventView } from '../audit/audit.service';
import { UpdateProfileDto } from './dto/update-profile.dto';
import { type MeView, UsersService } from './users.service';
import type { UserView } from './user.view';

/** The signed-in person's own account. Every route needs a signed-in caller and acts only on them. */
@Controller('users/me')
export class UsersController {
  constructor(private readonly users: UsersService) {}

  @Get()
  me(@CurrentUser() user: AuthUser): Promise<MeView> {
    return this.users.me(user.id);
  }

  @Patch()
  update(@CurrentUser() user: AuthUser, @Body() dto: UpdateProfileDto): Promise<UserView> {
    return this.users.updateProfile(user.id, dto.displayName);
  }

  @Get('activity')
  activity(@CurrentUser() user: AuthUser): Promise<{ events: AuditEventView[] }> {
    return this.users.activity(user.id).then((events) => ({ events }));
  }
}
