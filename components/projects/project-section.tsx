import type { ReactNode } from "react";
import { Card, CardBody, CardHeader } from "@/components/ui/card";

/** One section of the project page; `id` is the anchor the section list links to. */
export function ProjectSection({
  id,
  title,
  description,
  actions,
  children,
}: {
  id: string;
  title: string;
  description?: string;
  actions?: ReactNode;
  children: ReactNode;
}) {
  return (
    <section id={id} aria-labelledby={`${id}-title`} className="scroll-mt-6">
      <Card>
        <CardHeader title={<span id={`${id}-title`}>{title}</span>} description={description} actions={actions} />
        <CardBody>{children}</CardBody>
      </Card>
    </section>
  );
}
