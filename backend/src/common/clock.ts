import { type DynamicModule, Global, Module } from '@nestjs/common';

/**
 * The time, as the application sees it. Everything that expires (refresh tokens, reset links,
 * invitations) asks the injected Clock rather than `new Date()`, so tests can move time forward.
 */
export abstract class Clock {
  abstract now(): Date;
}

export class SystemClock extends Clock {
  now(): Date {
    return new Date();
  }
}

/** Provides the Clock everywhere: the system clock, or one handed in by a test. */
@Global()
@Module({})
export class ClockModule {
  static forRoot(clock: Clock = new SystemClock()): DynamicModule {
    return { module: ClockModule, providers: [{ provide: Clock, useValue: clock }], exports: [Clock] };
  }
}
