import type { INestApplication } from '@nestjs/common';
import { DocumentBuilder, SwaggerModule } from '@nestjs/swagger';

/**
 * Serves the OpenAPI description generated from the controllers and DTOs: the page at `/api/docs`,
 * the JSON at `/api/docs-json`. Both are public (they describe routes, not data).
 */
export function setupOpenApi(app: INestApplication, version: string): void {
  const config = new DocumentBuilder()
    .setTitle('Fieldbound API')
    .setDescription(
      'Saved maps with versions, pins and threads, viewing links, species lists, accounts and teams. ' +
        'Every route needs `Authorization: Bearer <access token>` except those marked public (sign-in, `GET /api/view/{token}`). ' +
        'Polarizabilities are in a0^3, fields in tesla. Invalid input answers 400 `{ statusCode, message, errors: { "field.path": [messages] } }`; ' +
        'a write based on a stale version answers 409 with the current state in `current`.',
    )
    .setVersion(version)
    .addBearerAuth()
    .build();
  const document = SwaggerModule.createDocument(app, config);
  SwaggerModule.setup('api/docs', app, document, { jsonDocumentUrl: 'api/docs-json', customSiteTitle: 'Fieldbound API' });
}
