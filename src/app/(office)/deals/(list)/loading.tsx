import { SectionLoading } from "@/components/section-loading";

export default SectionLoading;
