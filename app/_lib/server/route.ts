import 'server-only';
import { NextResponse, type NextRequest } from 'next/server';
import type { EntityManager } from '@mikro-orm/postgresql';
import type { z } from 'zod';
import { ApiToken, Lab, Membership, type LabRow } from '@/entities';
import type { Role } from '@/entities/membership';
import { auditRefusal } from '../labs/audit';
import { RequestBody, tooLarge, type BodylessRequest, type FormLimits, type StreamedForm } from './body-limit';
import { clientAddress, peerHeaderTrusted } from './client-address';
import { appOrigin, config, ownOrigins } from './config';
import { getEm } from './db';
import { errorResponse } from './error-response';
import { DomainError, forbidden, notFound, unauthorized } from './errors';
import { isUuid } from '../labs/load-in-lab';
import { can, type Action } from '../labs/permissions';
import { setSecurityHeaders } from './security-headers';
import { readSession, type UserRow } from '../accounts/session';
import { sha256 } from './secrets';

export interface Actor {
  user: UserRow;
  via: 'session' | 'token';
  sessionId?: string;
  /** For a token: the one lab it acts in. */
  tokenLabId?: string;
}

export interface Member {
  lab: LabRow;
  role: Role;
}

export interface RouteContext<P> {
  /** The request without its body: bodies are read only through `json`, `bodyStream` and `formData`. */
  req: BodylessRequest;
  params: P;
  em: EntityManager;
  actor: Actor | null;
  ip: string;
  /** The configured public origin (`APP_URL`), for links in e-mail and share links. */
  origin: string;
  /** The membership checked by `labAction`, when the route has one. */
  member?: Member;
  /** Reads and validates the JSON body (bytes counted as they stream in: 413 past the limit). */
  json<S extends z.ZodType>(schema: S): Promise<z.infer<S>>;
  /** The raw body as a stream (null without one), counted as it is read: 413 past the limit. */
  bodyStream(): ReadableStream<Uint8Array> | null;
  /** A multipart/form-data body parsed as it streams, files spooled to temporary files (removed after the handler). */
  formData(limits: FormLimits): Promise<StreamedForm>;
  /** The signed-in actor, or 401. */
  requireActor(): Actor;
  /**
   * The actor's membership of a lab, checked against the permissions table: 404 when the actor is
   * not a member (or a token of another lab), 403 when the role does not allow the action.
   */
  requireMember(labId: string, action: Action): Promise<Member>;
}

export interface RouteOptions {
  /** 'public': anyone; 'user': a signed-in actor (session or token); 'session': a browser session only. */
  auth: 'public' | 'user' | 'session';
  /** For routes under /api/labs/[labId]: the action checked against that lab before the handler runs. */
  labAction?: Action;
  /** Largest body accepted, bytes (default 64 KiB): 413 before anything is read when Content-Length says more, and as soon as the bytes read pass it. */
  maxBodyBytes?: number;
}

const STATE_CHANGING = new Set(['POST', 'PUT', 'PATCH', 'DELETE']);

export function clientIp(req: NextRequest): string {
  return clientAddress(req.headers, config.trustProxyHops, peerHeaderTrusted());
}

const crossOrigin = () => new DomainError('forbidden', 'cross_origin', 'Requests from another site are refused.');

/**
 * Cookie-authenticated state changes must come from our own origin (CSRF): the Origin header
 * must be the configured origin (or, without one, Sec-Fetch-Site must say same-origin). The
 * request's Host and X-Forwarded-* headers play no part.
 */
function checkOrigin(req: NextRequest) {
  const origin = req.headers.get('origin');
  if (origin) {
    if (!ownOrigins().has(origin)) throw crossOrigin();
    return;
  }
  if (req.headers.get('sec-fetch-site') !== 'same-origin') throw crossOrigin();
}

async function resolveActor(req: NextRequest, em: EntityManager): Promise<Actor | null> {
  const authz = req.headers.get('authorization');
  if (authz) {
    const m = /^Bearer\s+(\S+)$/i.exec(authz);
    if (!m) throw unauthorized('The Authorization header must be "Bearer <token>".');
    const token = await em.findOne(ApiToken, { tokenHash: sha256(m[1]), revokedAt: null, expiresAt: { $gt: new Date() } }, { populate: ['user'] });
    if (!token) throw unauthorized('That API token is not valid, has expired or has been revoked.');
    token.lastUsedAt = new Date();
    await em.flush();
    return { user: token.user, via: 'token', tokenLabId: token.lab.id };
  }
  const s = await readSession(em, req.cookies.get(config.sessionCookie)?.value);
  return s ? { user: s.user, via: 'session', sessionId: s.session.id } : null;
}

/**
 * The one wrapper around every route handler: body-size limit, same-origin check for cookie
 * requests that change state, the actor (session cookie or Bearer token), the permissions table,
 * a fresh EntityManager, and one error mapper.
 */
export function route<P extends Record<string, string> = Record<string, never>>(
  options: RouteOptions,
  handler: (ctx: RouteContext<P>) => Promise<Response>,
) {
  return async (req: NextRequest, segment: { params: Promise<P> }): Promise<Response> => {
    let em: EntityManager | undefined;
    let actor: Actor | null = null;
    let refusedLab: string | null = null;
    try {
      const max = options.maxBodyBytes ?? config.maxJsonBytes;
      const length = Number(req.headers.get('content-length') ?? 0);
      if (length > max) throw tooLarge(max);
      const bodyReader = new RequestBody(req, max);
      const bearer = req.headers.has('authorization');
      if (STATE_CHANGING.has(req.method) && !bearer) checkOrigin(req);
      em = await getEm();
      const params = (await segment.params) ?? ({} as P);
      actor = await resolveActor(req, em);
      const ctx: RouteContext<P> = {
        req,
        params,
        em,
        actor,
        ip: clientIp(req),
        origin: appOrigin(),
        async json(schema) {
          const text = await bodyReader.text();
          let body: unknown;
          try {
            body = text ? JSON.parse(text) : {};
          } catch {
            throw new DomainError('bad_request', 'bad_json', 'The request body is not valid JSON.');
          }
          return schema.parse(body);
        },
        bodyStream: () => bodyReader.stream(),
        formData: (limits) => bodyReader.form(req.headers.get('content-type'), limits),
        requireActor() {
          if (!actor) throw unauthorized();
          return actor;
        },
        async requireMember(labId, action) {
          const a = ctx.requireActor();
          if (!isUuid(labId)) throw notFound();
          if (a.via === 'token' && a.tokenLabId !== labId) throw notFound();
          // the membership, then its lab by key (cheaper than the ORM's populate on this path of every call)
          const m = await em!.findOne(Membership, { user: a.user.id, lab: labId });
          if (!m || !(await em!.findOne(Lab, { id: labId }))) throw notFound();
          if (!can(m.role, action)) {
            refusedLab = labId;
            throw forbidden();
          }
          return { lab: m.lab, role: m.role };
        },
      };
      if (options.auth !== 'public') {
        const a = ctx.requireActor();
        if (options.auth === 'session' && a.via !== 'session') throw forbidden('This needs a signed-in browser session, not an API token.');
      }
      if (options.labAction) {
        const labId = (params as Record<string, string>).labId;
        if (!labId) throw new Error('labAction needs a [labId] segment');
        ctx.member = await ctx.requireMember(labId, options.labAction);
      }
      const res = await handler(ctx).finally(() => bodyReader.cleanup());
      // no-store unless the handler chose (a private, revalidated ETag answer: http-cache.ts)
      if (!res.headers.has('Cache-Control')) res.headers.set('Cache-Control', 'no-store');
      setSecurityHeaders(res.headers, config.appUrl);
      return res;
    } catch (e) {
      const res = errorResponse(e);
      if (res.status === 403 || res.status === 429) {
        await auditRefusal(em, { status: res.status, what: `${req.method} ${req.nextUrl.pathname}`, actor: actor?.user ?? null, lab: refusedLab, ip: clientIp(req) });
      }
      setSecurityHeaders(res.headers, config.appUrl);
      return res;
    }
  };
}

export const json = (body: unknown, init?: ResponseInit) => NextResponse.json(body, init);
