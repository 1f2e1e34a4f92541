// The oidc-provider package ships no type declarations; these cover the part the local provider uses.
declare module 'oidc-provider' {
  import type { IncomingMessage, ServerResponse } from 'node:http';

  export interface KoaContextWithOIDC {
    oidc: {
      client?: { clientId: string };
      session?: { accountId?: string; grantIdFor(clientId: string): string | undefined };
      result?: { login?: unknown; consent?: { grantId?: string } };
    };
  }

  export interface InteractionDetails {
    uid: string;
    prompt: { name: string };
    params: Record<string, unknown>;
  }

  export class Grant {
    constructor(init: { clientId: string; accountId: string });
    static find(id: string): Promise<Grant | undefined>;
    addOIDCScope(scope: string): void;
    save(): Promise<string>;
  }

  export class Provider {
    constructor(issuer: string, configuration: Record<string, unknown>);
    Grant: typeof Grant;
    proxy: boolean;
    callback(): (req: IncomingMessage, res: ServerResponse) => void;
    interactionDetails(req: IncomingMessage, res: ServerResponse): Promise<InteractionDetails>;
    interactionFinished(req: IncomingMessage, res: ServerResponse, result: Record<string, unknown>, options?: { mergeWithLastSubmission?: boolean }): Promise<void>;
    on(event: string, listener: (...args: unknown[]) => void): this;
  }

  export namespace interactionPolicy {
    class Check {
      static REQUEST_PROMPT: boolean;
      static NO_NEED_TO_PROMPT: boolean;
      constructor(reason: string, description: string, check: (ctx: KoaContextWithOIDC) => boolean | Promise<boolean>);
    }
    interface Prompt {
      checks: { add(check: Check, index?: number): void };
    }
    interface Policy extends Array<Prompt> {
      get(name: string): Prompt;
    }
    function base(): Policy;
  }

  export default Provider;
}
