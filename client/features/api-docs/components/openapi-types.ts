/**
 * The parts of an OpenAPI 3.1 document (and of the JSON Schema 2020-12 it embeds) that the API
 * page reads. Everything else in a document is ignored.
 */
export interface JsonSchema {
  $ref?: string;
  type?: string | string[];
  description?: string;
  properties?: Record<string, JsonSchema>;
  required?: string[];
  items?: JsonSchema;
  additionalProperties?: boolean | JsonSchema;
  propertyNames?: JsonSchema;
  enum?: unknown[];
  const?: unknown;
  anyOf?: JsonSchema[];
  oneOf?: JsonSchema[];
  allOf?: JsonSchema[];
  default?: unknown;
  format?: string;
  pattern?: string;
  minLength?: number;
  maxLength?: number;
  minimum?: number;
  maximum?: number;
  exclusiveMinimum?: number;
  exclusiveMaximum?: number;
  minItems?: number;
  maxItems?: number;
}

export interface OpenApiParameter {
  name: string;
  in: 'path' | 'query' | 'header' | 'cookie';
  required?: boolean;
  description?: string;
  schema?: JsonSchema;
}

export interface OpenApiOperation {
  operationId?: string;
  summary?: string;
  description?: string;
  tags?: string[];
  security?: Array<Record<string, string[]>>;
  parameters?: OpenApiParameter[];
  requestBody?: { required?: boolean; content?: Record<string, { schema?: JsonSchema }> };
  /** Answers by status (`200`, `404`, …), each written out or a `$ref` to `#/components/responses/…`. */
  responses?: Record<string, OpenApiResponse | OpenApiRef>;
  'x-lagbook-permission'?: string;
}

/** A reference to another part of the document (`#/components/responses/NotFound`). */
export interface OpenApiRef {
  $ref: string;
}

/** One answer of an operation: what it means, its body's media types and its headers. */
export interface OpenApiResponse {
  description?: string;
  content?: Record<string, { schema?: JsonSchema }>;
  headers?: Record<string, { description?: string; schema?: JsonSchema }>;
}

export interface OpenApiSecurityScheme {
  type: string;
  scheme?: string;
  in?: string;
  name?: string;
  bearerFormat?: string;
  description?: string;
}

export interface OpenApiDocument {
  openapi: string;
  info: { title: string; version: string; summary?: string; description?: string };
  servers?: Array<{ url: string }>;
  paths: Record<string, Record<string, OpenApiOperation | unknown>>;
  components?: { securitySchemes?: Record<string, OpenApiSecurityScheme>; schemas?: Record<string, JsonSchema>; responses?: Record<string, OpenApiResponse> };
}
