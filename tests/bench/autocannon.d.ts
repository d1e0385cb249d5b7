// The part of autocannon 9's API the plant benchmark uses (the package ships no types).
declare module "autocannon" {
  namespace autocannon {
    interface Request {
      method?: "GET" | "POST";
      path?: string;
      headers?: Record<string, string>;
      body?: string | Buffer;
      setupRequest?: (req: Request) => Request;
      onResponse?: (status: number, body: string) => void;
    }
    interface Options {
      url: string;
      connections?: number;
      amount?: number;
      duration?: number;
      timeout?: number;
      headers?: Record<string, string>;
      requests?: Request[];
    }
    interface Result {
      non2xx: number;
      errors: number;
      timeouts: number;
      requests: { total: number };
    }
    interface Instance extends PromiseLike<Result> {
      on(
        event: "response",
        listener: (
          client: unknown,
          statusCode: number,
          resBytes: number,
          responseTime: number,
        ) => void,
      ): this;
      on(event: "reqError", listener: (error: Error) => void): this;
    }
  }
  function autocannon(options: autocannon.Options): autocannon.Instance;
  export default autocannon;
}
