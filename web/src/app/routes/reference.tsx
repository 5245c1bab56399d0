import { useEffect } from 'react';
import { Section } from '../../components/ui/section';
import { Table, Td, Th } from '../../components/ui/table';
import {
  BLOCK_REFERENCE,
  FUNCTION_REFERENCE,
  KEY_REFERENCE,
  TOPIC_REFERENCE,
  type ExampleBlock,
  type FunctionReference,
} from '../../config/sheet-reference';

const GROUPS: { group: FunctionReference['group']; title: string }[] = [
  { group: 'generator', title: 'Generators (models for modes blocks)' },
  { group: 'math', title: 'Functions' },
  { group: 'matrix', title: 'Matrices and vectors' },
  { group: 'units', title: 'Unit conversion' },
];

/** The reference's words, with `code` set as code. */
function Words({ text }: { text: string }) {
  return (
    <>
      {text.split('`').map((part, i) =>
        i % 2 === 1 ? (
          <code key={i} className="bg-paper-deep px-1 font-mono text-[0.9em]">
            {part}
          </code>
        ) : (
          part
        ),
      )}
    </>
  );
}

function Example({ blocks }: { blocks: readonly ExampleBlock[] }) {
  return (
    <pre className="overflow-x-auto rounded-sm bg-paper-deep px-2 py-1 font-mono text-xs whitespace-pre">
      {blocks
        .map((b) => (blocks.length > 1 ? `# ${b.kind} block\n${b.source.trimEnd()}` : b.source))
        .join('\n\n')
        .trimEnd()}
    </pre>
  );
}

/**
 * The reference of the sheet language, from the one data module the editor's completion and hover
 * also read; every example on it evaluates (the reference's test runs them through the engine).
 */
export function ReferenceRoute() {
  useEffect(() => {
    document.title = 'Sheet reference · Modewright';
  }, []);
  return (
    <div className="flex flex-col gap-6">
      <header>
        <h1 className="text-xl font-semibold">Sheet reference</h1>
        <p className="text-sm text-ink-soft">
          Every block kind, the keys of modes, matrix and response blocks, and the functions and
          generators a calculation line offers, each with an example that evaluates as written. In
          the editor, hover a function or a key for the same words, and press Ctrl+Space for
          completion.
        </p>
        <nav aria-label="Reference contents" className="mt-2 flex flex-wrap gap-3 text-sm">
          <a className="text-accent-strong hover:underline" href="#blocks">
            Blocks
          </a>
          {Object.keys(KEY_REFERENCE).map((kind) => (
            <a key={kind} className="text-accent-strong hover:underline" href={`#keys-${kind}`}>
              Keys of a {kind} block
            </a>
          ))}
          <a className="text-accent-strong hover:underline" href="#functions">
            Functions and generators
          </a>
          {TOPIC_REFERENCE.map((t) => (
            <a key={t.id} className="text-accent-strong hover:underline" href={`#${t.id}`}>
              {t.title}
            </a>
          ))}
        </nav>
      </header>

      <section id="blocks" aria-label="Block kinds" className="flex flex-col gap-3">
        <h2 className="text-lg font-semibold">Blocks</h2>
        {BLOCK_REFERENCE.map((b) => (
          <article key={b.kind} aria-label={`${b.label} block`} className="flex flex-col gap-1">
            <h3 className="font-semibold">
              {b.label} <span className="font-mono text-xs text-ink-faint">{b.kind}</span>
            </h3>
            <p className="text-sm">
              <Words text={b.summary} />
            </p>
            <Example blocks={b.example} />
          </article>
        ))}
      </section>

      {Object.entries(KEY_REFERENCE).map(([kind, keys]) => (
        <section key={kind} id={`keys-${kind}`}>
          <Section title={`Keys of a ${kind} block`}>
            <Table caption={`Keys of a ${kind} block`} scrollable>
              <thead>
                <tr>
                  <Th>Key</Th>
                  <Th>Value</Th>
                  <Th>Default</Th>
                  <Th>Meaning</Th>
                </tr>
              </thead>
              <tbody>
                {keys.map((k) => (
                  <tr key={k.key}>
                    <Td className="font-mono whitespace-nowrap">{k.key}:</Td>
                    <Td>{k.value}</Td>
                    <Td>{k.default ?? 'required'}</Td>
                    <Td>
                      <Words text={k.summary} />
                    </Td>
                  </tr>
                ))}
              </tbody>
            </Table>
          </Section>
        </section>
      ))}

      <section id="functions" aria-label="Functions and generators" className="flex flex-col gap-4">
        <h2 className="text-lg font-semibold">Functions and generators</h2>
        {GROUPS.map(({ group, title }) => (
          <div key={group} className="flex flex-col gap-2">
            <h3 className="font-semibold">{title}</h3>
            {FUNCTION_REFERENCE.filter((f) => f.group === group).map((f) => (
              <article
                key={f.name}
                aria-label={f.name}
                className="flex flex-col gap-0.5 border-b border-rule pb-2"
              >
                <p className="font-mono text-sm font-semibold">{f.signature}</p>
                <p className="text-sm">
                  <Words text={f.summary} />
                </p>
                <p className="text-xs text-ink-soft">Units: {f.units}</p>
                <Example blocks={f.example} />
              </article>
            ))}
          </div>
        ))}
      </section>

      {TOPIC_REFERENCE.map((t) => (
        <section key={t.id} id={t.id} aria-label={t.title} className="flex flex-col gap-2">
          <h2 className="text-lg font-semibold">{t.title}</h2>
          {t.paragraphs.map((text, i) => (
            <p key={i} className="max-w-3xl text-sm">
              <Words text={text} />
            </p>
          ))}
          <p className="text-xs text-ink-soft">The uploaded files of the example:</p>
          <pre className="overflow-x-auto rounded-sm bg-paper-deep px-2 py-1 font-mono text-xs whitespace-pre">
            {t.uploads.map((u) => `# ${u.name}\n${u.text.trimEnd()}`).join('\n\n')}
          </pre>
          <p className="text-xs text-ink-soft">The blocks that read them:</p>
          <Example blocks={t.example} />
        </section>
      ))}
    </div>
  );
}
